import Feather from '@expo/vector-icons/Feather';
import { Link, router, useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, layout, space } from '@/components/theme';
import { ApiRequestError } from '@/lib/api-errors';
import { RoleGate } from '@/features/auth';
import type { Role, SessionUser } from '@/features/session/schema';
import { designToFile } from '@/features/registry/csv';
import {
  useDesignDecisionMutation,
  useDesignPendingQuery,
  useDesignVersionQuery,
  useDesignVersionsQuery,
  useRideQuery,
} from '@/features/registry/api';
import { DesignComparison } from '@/features/registry/design-comparison';
import type { DesignData } from '@/features/loads/design-schema';
import {
  DesignDrawingPanel,
  DesignTables,
  DesignVersionCard,
  useDesignAnalysis,
} from '@/features/registry/design-view';
import { exportFileName } from '@/features/registry/import-report';
import { Panes } from '@/components/panes';
import { RideNotFound, canEditRides, useRideIdParam } from '@/features/registry/ride-route';
import { saveTextFile } from '@/features/registry/save-file';
import type { DesignVersion, DesignVersionInfo } from '@/features/registry/schema';
import { designOriginLabel } from '@/features/registry/design-format';
import { formatDateTime } from '@/lib/dates';
import { rideDesignHref, rideHref, rideImportHref, ridesHref, rideVersionHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';
import { useUnitSystem } from '@/features/settings';

const staff = ['admin', 'supervisor', 'inspector'] as const;

/** A ride's current design data in full: drawing, peaks, every table, export, and its version history. */
export function DesignScreen() {
  const id = useRideIdParam();
  return <RoleGate roles={staff}>{(user) => <CurrentDesign id={id} user={user} />}</RoleGate>;
}

function CurrentDesign({ id, user }: { id: string; user: SessionUser }) {
  const ride = useRideQuery(id);
  if (ride.error instanceof ApiRequestError && ride.error.status === 404)
    return <RideNotFound back={{ href: ridesHref, label: 'Rides' }} />;
  return (
    <QueryState query={ride}>
      {({ ride: r, design }) =>
        design ? (
          <DesignPage ride={r} design={design} currentVersion={design.version} user={user} />
        ) : (
          <SubScreen title="Design data" subtitle={r.name} back={{ href: rideHref(r.id), label: r.name }}>
            <Card>
              <Text variant="heading">No design data yet</Text>
              <Text muted>Import it from the maker’s design document.</Text>
            </Card>
          </SubScreen>
        )
      }
    </QueryState>
  );
}

/** One earlier (or the current) version, as it was: versions never change once made. */
export function DesignVersionScreen() {
  const id = useRideIdParam();
  const { version } = useLocalSearchParams<{ version: string }>();
  const n = Number(Array.isArray(version) ? version[0] : version);
  return <RoleGate roles={staff}>{(user) => <OldDesign id={id} version={n} user={user} />}</RoleGate>;
}

function OldDesign({ id, version, user }: { id: string; version: number; user: SessionUser }) {
  const ride = useRideQuery(id);
  const design = useDesignVersionQuery(id, version);
  if (ride.error instanceof ApiRequestError && ride.error.status === 404)
    return <RideNotFound back={{ href: ridesHref, label: 'Rides' }} />;
  if (design.error instanceof ApiRequestError && design.error.status === 404)
    return (
      <SubScreen title="No such version" back={{ href: rideDesignHref(id), label: 'Design data' }}>
        <Card role="alert">
          <Text>This ride has no design data version {String(version)}.</Text>
        </Card>
      </SubScreen>
    );
  return (
    <QueryState query={ride}>
      {({ ride: r, design: current }) => (
        <QueryState query={design}>
          {(d) => <DesignPage ride={r} design={d} currentVersion={current?.version ?? null} user={user} />}
        </QueryState>
      )}
    </QueryState>
  );
}

function DesignPage({
  ride,
  design,
  currentVersion,
  user,
}: {
  ride: RideSummary;
  design: DesignVersion;
  currentVersion: number | null;
  user: SessionUser;
}) {
  const role: Role = user.role;
  const [system] = useUnitSystem();
  const analysis = useDesignAnalysis(design.data);
  const versions = useDesignVersionsQuery(ride.id);
  const isCurrent = design.version === currentVersion;
  const inForce = currentVersion ? ` Version ${currentVersion} is in force.` : '';
  const noteText =
    design.approvalState === 'pending'
      ? `Proposed, waiting for a second person’s approval: not in force.${inForce}`
      : design.approvalState === 'rejected'
        ? `Rejected by ${design.decidedByName ?? 'a reviewer'}${design.decisionReason ? `: “${design.decisionReason}”` : ''}. Never in force.${inForce}`
        : `An earlier version, shown as it was.${inForce}`;
  const note = isCurrent ? null : (
    <View style={styles.oldNote} role="note">
      <Feather name="clock" size={16} color={colors.near} />
      <Text variant="small" color={colors.near} style={styles.flex}>
        {noteText}
      </Text>
    </View>
  );
  const side = (
    <>
      <DesignVersionCard version={design} data={design.data} note={note} />
      <ExportCard ride={ride} version={design.version} data={design.data} />
      {canEditRides(role) && isCurrent ? (
        <Button
          label="Import a new version"
          tone="quiet"
          icon={<Feather name="upload" size={18} color={colors.text} />}
          onPress={() => router.push(rideImportHref(ride.id))}
        />
      ) : null}
      <Card>
        <Text variant="heading">Version history</Text>
        {versions.isPending ? (
          <ActivityIndicator color={colors.base} />
        ) : versions.data ? (
          <VersionList
            rideId={ride.id}
            versions={versions.data}
            shown={design.version}
            current={currentVersion}
          />
        ) : (
          <Text muted>The history could not be loaded.</Text>
        )}
      </Card>
    </>
  );
  return (
    <SubScreen
      title={isCurrent ? 'Design data' : `Design data v${design.version}`}
      subtitle={`${ride.name} · ${design.data.source.document}, revision ${design.data.source.revision}`}
      back={
        isCurrent
          ? { href: rideHref(ride.id), label: ride.name }
          : { href: rideDesignHref(ride.id), label: 'Current design data' }
      }
    >
      {canEditRides(role) && (isCurrent || design.approvalState === 'pending') ? (
        <PendingRevision rideId={ride.id} user={user} />
      ) : null}
      <Panes
        main={<DesignDrawingPanel data={design.data} system={system} analysis={analysis} />}
        side={side}
      />
      <DesignTables data={design.data} system={system} />
    </SubScreen>
  );
}

function VersionList({
  rideId,
  versions,
  shown,
  current,
}: {
  rideId: string;
  versions: DesignVersionInfo[];
  shown: number;
  current: number | null;
}) {
  return (
    <View accessibilityLabel="Design data versions">
      {versions.map((v) => (
        <Link
          key={v.id}
          href={v.version === current ? rideDesignHref(rideId) : rideVersionHref(rideId, v.version)}
          asChild
        >
          <Pressable
            role="link"
            accessibilityLabel={`Version ${v.version}${v.version === current ? ', in force' : stateWords(v)}: ${v.reason}`}
            style={v.version === shown ? styles.versionShown : styles.version}
          >
            <View style={styles.versionHead}>
              <Text variant="heading">
                v{v.version}
                {v.version === current ? ' · in force' : stateWords(v).replace(',', ' ·')}
              </Text>
              <Text variant="small" muted>
                {formatDateTime(v.createdAt)}
              </Text>
            </View>
            <Text variant="small" numberOfLines={2}>
              {v.reason}
            </Text>
            <Text variant="small" muted>
              {v.createdByName} · {designOriginLabel[v.origin]}
            </Text>
          </Pressable>
        </Link>
      ))}
    </View>
  );
}

const stateWords = (v: DesignVersionInfo) =>
  v.approvalState === 'pending' ? ', awaiting approval' : v.approvalState === 'rejected' ? ', rejected' : '';

/**
 * The revision waiting for a second person, compared field by field with the version in force. Another
 * supervisor or admin approves or rejects it with a reason; its proposer only sees that it waits (the
 * server refuses a proposer's decision too).
 */
function PendingRevision({ rideId, user }: { rideId: string; user: SessionUser }) {
  const [system] = useUnitSystem();
  const query = useDesignPendingQuery(rideId);
  const decide = useDesignDecisionMutation(rideId);
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  const pending = query.data?.pending ?? null;
  const current = query.data?.current ?? null;
  if (!pending) return null;
  const own = pending.createdById === user.id;
  const send = async (decision: 'approve' | 'reject') => {
    setError(null);
    if (!reason.trim()) {
      setError(decision === 'approve' ? 'Say why it may be approved' : 'Say why it is rejected');
      return;
    }
    try {
      await decide.mutateAsync({ version: pending.version, decision, reason: reason.trim() });
      setReason('');
    } catch (err) {
      setError(
        err instanceof ApiRequestError
          ? err.message
          : 'The decision could not be sent. Nothing was changed; try again when online.',
      );
    }
  };
  return (
    <Card style={styles.pending} accessibilityLabel={`Version ${pending.version} waits for approval`}>
      <View style={styles.pendingHead}>
        <Feather name="clock" size={20} color={colors.near} />
        <Text variant="heading" role="heading" aria-level={2} style={styles.flex}>
          Version {pending.version} waits for a second person
        </Text>
      </View>
      <Text>
        Proposed by {pending.createdByName}, {formatDateTime(pending.createdAt)}: “{pending.reason}”.{' '}
        {pending.data.source.document}, revision {pending.data.source.revision}.
      </Text>
      <DesignComparison
        before={current?.data ?? null}
        after={pending.data}
        system={system}
        beforeLabel={current ? `version ${current.version}` : 'nothing yet'}
        afterLabel={`version ${pending.version}`}
      />
      {own ? (
        <View style={styles.pendingHead} role="note">
          <Feather name="users" size={18} color={colors.textMuted} />
          <Text muted style={styles.flex}>
            You proposed this version: another supervisor or an admin must approve or reject it.
          </Text>
        </View>
      ) : (
        <View style={styles.decision}>
          <TextField
            label="Your reason"
            hint="Kept with the version and in the audit log, e.g. “Checked against the maker’s letter of 12 May”."
            value={reason}
            onChangeText={setReason}
            error={error ?? undefined}
            multiline
          />
          <View style={styles.buttons}>
            <Button
              label={`Approve version ${pending.version}`}
              tone="accent"
              icon={<Feather name="check" size={18} color={colors.baseText} />}
              busy={decide.isPending && decide.variables?.decision === 'approve'}
              disabled={decide.isPending}
              onPress={() => send('approve')}
            />
            <Button
              label="Reject"
              tone="quiet"
              icon={<Feather name="x" size={18} color={colors.text} />}
              busy={decide.isPending && decide.variables?.decision === 'reject'}
              disabled={decide.isPending}
              onPress={() => send('reject')}
            />
          </View>
        </View>
      )}
    </Card>
  );
}

/** The design data as a file, the same format import reads (written by the same code as the server’s export). */
export function ExportCard({
  ride,
  version,
  data,
}: {
  ride: RideSummary;
  version: number;
  data: DesignData;
}) {
  const [saved, setSaved] = useState<string | null>(null);
  const save = async (format: 'csv' | 'json') => {
    const name = exportFileName(ride.name, version, format);
    setSaved(
      await saveTextFile(
        name,
        designToFile(format, data),
        format === 'csv' ? 'text/csv' : 'application/json',
      ),
    );
  };
  return (
    <Card>
      <Text variant="heading">Export v{version}</Text>
      <Text variant="small" muted>
        CSV (one row per part, pivot, seat…) or JSON, in SI units. Import reads the same files back.
      </Text>
      <View style={styles.buttons}>
        <Button
          label="Download CSV"
          tone="quiet"
          icon={<Feather name="download" size={18} color={colors.text} />}
          onPress={() => save('csv')}
        />
        <Button
          label="Download JSON"
          tone="quiet"
          icon={<Feather name="download" size={18} color={colors.text} />}
          onPress={() => save('json')}
        />
      </View>
      {saved ? (
        <Text variant="small" muted accessibilityLiveRegion="polite">
          {saved}
        </Text>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1 },
  oldNote: {
    flexDirection: 'row',
    gap: space.sm,
    alignItems: 'center',
    backgroundColor: colors.nearSoft,
    padding: space.sm,
    borderRadius: 6,
  },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  pending: { gap: space.md, borderColor: colors.near, borderWidth: 2 },
  pendingHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  decision: { gap: space.md },
  version: {
    minHeight: layout.touchTarget,
    paddingVertical: space.sm,
    paddingHorizontal: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
    gap: 2,
  },
  versionShown: {
    minHeight: layout.touchTarget,
    paddingVertical: space.sm,
    paddingHorizontal: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
    gap: 2,
    backgroundColor: colors.accentSoft,
    borderLeftWidth: 3,
    borderLeftColor: colors.accent,
  },
  versionHead: { flexDirection: 'row', justifyContent: 'space-between', flexWrap: 'wrap', gap: space.sm },
});
