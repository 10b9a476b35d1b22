import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { LinkCard } from '@/components/link-card';
import Feather from '@/components/feather-icon';
import { Panes } from '@/components/panes';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { useDesignVersionsQuery } from '@/features/registry/api';
import { DesignDocumentsCard } from '@/features/registry/design-documents-card';
import { ExportCard } from '@/features/registry/design-export-card';
import { designOriginLabel } from '@/features/registry/design-format';
import {
  DesignDrawingPanel,
  DesignTables,
  DesignVersionCard,
  useDesignAnalysis,
} from '@/features/registry/design-view';
import { PendingRevision } from '@/features/registry/pending-revision';
import { canEditRides } from '@/features/registry/ride-route';
import type { DesignVersion, DesignVersionInfo } from '@/features/registry/schema';
import {
  rideDesignEditHref,
  rideDesignHref,
  rideHref,
  rideImportHref,
  rideVersionHref,
} from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';
import type { Role, SessionUser } from '@/features/session/schema';
import { useUnitSystem } from '@/features/settings';
import { formatDateTime } from '@/lib/dates';

export function DesignPage({
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
      <DesignDocumentsCard
        rideId={ride.id}
        version={design.version}
        editable={canEditRides(role) && design.approvalState !== 'rejected'}
      />
      <ExportCard ride={ride} version={design.version} data={design.data} />
      {canEditRides(role) && isCurrent ? (
        <Button
          label="Import a new version"
          tone="quiet"
          icon={<Feather name="upload" size={18} color={colors.text} />}
          onPress={() => router.push(rideImportHref(ride.id))}
        />
      ) : null}
      {canEditRides(role) && isCurrent ? (
        <Button
          label="Edit values field by field"
          tone="quiet"
          icon={<Feather name="edit-3" size={18} color={colors.text} />}
          onPress={() => router.push(rideDesignEditHref(ride.id))}
        />
      ) : null}
      <Card>
        <Text variant="heading">Version history</Text>
        {versions.isPending ? (
          <Spinner color={colors.base} />
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
        <LinkCard
          key={v.id}
          href={v.version === current ? rideDesignHref(rideId) : rideVersionHref(rideId, v.version)}
          title={
            <Text variant="heading">
              Version {v.version}
              {v.version === current ? ' · in force' : stateWords(v).replace(',', ' ·')}
            </Text>
          }
          plain
          style={v.version === shown ? styles.versionShown : styles.version}
        >
          {(title) => (
            <>
              <View style={styles.versionHead}>
                {title}
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
            </>
          )}
        </LinkCard>
      ))}
    </View>
  );
}

const stateWords = (v: DesignVersionInfo) =>
  v.approvalState === 'pending' ? ', awaiting approval' : v.approvalState === 'rejected' ? ', rejected' : '';

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
