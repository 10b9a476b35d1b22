import { type Href, Link, router } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { ChainCard } from '@/features/ride-page/chain-card';
import { RideDailyChecksCard } from '@/features/daily-checks/ui';
import { Button } from '@/components/button';
import Feather from '@/components/feather-icon';
import { auditHref } from '@/features/registry';
import {
  RideNotFound,
  canEditRides,
  useRideIdParam,
  useMyAssignmentsQuery,
  useRideSchedulesQuery,
  useRideQuery,
  DesignDrawingPanel,
  DesignVersionCard,
  Field,
  useDesignAnalysis,
  DueMark,
  dueInWords,
  PlateSheetDownload,
} from '@/features/registry/ui';
import { RideSetupsCard } from '@/features/registry/ui-rides';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { RideStatusMark } from '@/components/status-mark';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { ApiRequestError } from '@/lib/api-errors';
import { roleHome } from '@/features/auth';
import { RoleGate } from '@/features/auth/ui';
import type { Role, SessionUser } from '@/features/session/schema';
import { Panes } from '@/components/panes';
import { type DesignVersion, type Schedule, inspectionTypeLabel } from '@/features/registry/schema';
import { formatDate, formatDateTime } from '@/lib/dates';
import { InspectRideCard } from '@/features/inspections/ui';
import { RideBulletinsCard } from '@/features/bulletins/ui';
import { PivotLifeSection } from '@/features/pivot-life/ui';
import { RIDE_NOTICES_PAGE, useRideNotices } from '@/features/notices';
import { NoticeRow } from '@/features/notices/ui';
import { IncidentRow, useRideIncidents } from '@/features/incidents/ui';
import {
  rideDesignHref,
  rideEditHref,
  rideImportHref,
  rideIncidentNewHref,
  rideIncidentsHref,
  rideLogHref,
  rideLogbookHref,
  rideNdtHref,
  ridePartsHref,
  rideScheduleHref,
  ridesHref,
  rideStatusHref,
} from '@/features/rides';
import { type RideSummary, rideClassLabel } from '@/features/rides/schema';
import { useUnitSystem } from '@/features/settings';

const isStaff = (role: Role) => role !== 'operator';

/**
 * One ride: identity, status (with its reason and since when), site and operator. Staff also see the
 * current design data — its version, the chain drawn to scale with each pivot's peak load at the design
 * motion — and the ride's inspection schedule. Operators see their own company's rides and status only;
 * the server answers 404 for anything else, shown here as "not found".
 */
export function RideDetailScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector', 'operator']}>
      {(user) => <RideDetail id={id} user={user} />}
    </RoleGate>
  );
}

function RideDetail({ id, user }: { id: string; user: SessionUser }) {
  const ride = useRideQuery(id);
  const back: { href: Href; label: string } = isStaff(user.role)
    ? { href: ridesHref, label: 'Rides' }
    : { href: roleHome[user.role], label: 'My rides' };
  if (ride.error instanceof ApiRequestError && ride.error.status === 404) {
    return <RideNotFound back={back} />;
  }
  return (
    <QueryState query={ride}>
      {({ ride: r, design }) => <RideDetailBody ride={r} design={design} user={user} back={back} />}
    </QueryState>
  );
}

function RideDetailBody({
  ride,
  design,
  user,
  back,
}: {
  ride: RideSummary;
  design: DesignVersion | null;
  user: SessionUser;
  back: { href: Href; label: string };
}) {
  const editor = canEditRides(user.role);
  const staff = isStaff(user.role);
  const lifeLinks = [
    { href: rideLogHref(ride.id), label: 'Running log' },
    { href: rideNdtHref(ride.id), label: 'NDT records' },
    { href: ridePartsHref(ride.id), label: 'Parts and documents' },
  ];

  const info = (
    <>
      {/* The inspector's next step on this ride comes first: on a phone it is what they came for. */}
      {user.role === 'inspector' ? <InspectRideCard rideId={ride.id} /> : null}
      <StatusCard ride={ride} editor={editor} />
      <IncidentsCard rideId={ride.id} operator={user.role === 'operator'} />
      <Card>
        <Text variant="heading">Ride</Text>
        <Field label="Class" value={rideClassLabel[ride.rideClass]} />
        {ride.description ? <Field label="Description" value={ride.description} /> : null}
        <Field label="Maker and model" value={[ride.maker, ride.model].filter(Boolean).join(' · ') || '—'} />
        <View style={styles.pair}>
          <Field label="Serial" value={ride.serial ?? '—'} figure />
          <Field label="Built" value={ride.year ? String(ride.year) : '—'} figure />
        </View>
        <Field label="Site" value={ride.siteName ?? 'No site'} />
        <Field label="Operator" value={ride.operatorName} />
        <LinkRow href={rideLogbookHref(ride.id)} label="Logbook: everything that happened" icon="list" />
        {editor ? <LinkRow href={auditHref(ride.id)} label="History of changes" icon="clock" /> : null}
      </Card>
      {staff && design ? (
        <DesignVersionCard
          version={design}
          data={design.data}
          footer={<DesignLinks rideId={ride.id} editor={editor} />}
        />
      ) : null}
      {user.role === 'admin' ? <PlateSheetDownload ride={ride} /> : null}
      {staff ? <ScheduleCard rideId={ride.id} role={user.role} /> : null}
      <RideBulletinsCard rideId={ride.id} role={user.role} timeZone={ride.siteTimeZone} />
      <RideSetupsCard rideId={ride.id} planner={editor} />
      {staff ? <NoticesCard rideId={ride.id} /> : null}
      <RideDailyChecksCard rideId={ride.id} />
      {user.role === 'inspector' ? null : <ChainCard rideId={ride.id} />}
      {staff ? null : <PivotLifeSection rideId={ride.id} links={lifeLinks} />}
    </>
  );

  const designPane = staff ? (
    <>
      {design ? (
        <DesignPane design={design} />
      ) : (
        <Card>
          <Text variant="heading">No design data yet</Text>
          <Text muted>
            Without design data there is nothing to check inspections against. Import it from the maker’s
            design document (CSV or JSON).
          </Text>
          {editor ? (
            <Button
              label="Import design data"
              tone="accent"
              onPress={() => router.push(rideImportHref(ride.id))}
              style={styles.start}
            />
          ) : null}
        </Card>
      )}
      <PivotLifeSection rideId={ride.id} design={design?.data ?? null} links={lifeLinks} />
    </>
  ) : null;

  return (
    <SubScreen
      title={ride.name}
      subtitle={`${rideClassLabel[ride.rideClass]} · ${ride.siteName ?? 'No site'} · ${ride.operatorName}`}
      badge={<RideStatusMark status={ride.status} />}
      back={back}
      actions={
        editor ? (
          <>
            <Button
              label="Change status"
              tone="accent"
              onPress={() => router.push(rideStatusHref(ride.id))}
            />
            <Button label="Edit ride" tone="quiet" onPress={() => router.push(rideEditHref(ride.id))} />
          </>
        ) : null
      }
    >
      {staff ? <Panes main={designPane} side={info} /> : <View style={styles.stack}>{info}</View>}
    </SubScreen>
  );
}

function StatusCard({ ride, editor }: { ride: RideSummary; editor: boolean }) {
  return (
    <Card accessibilityLabel="Ride status">
      <Text variant="heading">Status</Text>
      <RideStatusMark status={ride.status} />
      {ride.statusReason ? <Field label="Reason" value={ride.statusReason} /> : null}
      <Field label="Since" value={ride.statusSince ? formatDateTime(ride.statusSince) : '—'} />
      {editor ? <LinkRow href={rideStatusHref(ride.id)} label="Change status" icon="edit-3" /> : null}
    </Card>
  );
}

function DesignPane({ design }: { design: DesignVersion }) {
  const [system] = useUnitSystem();
  const analysis = useDesignAnalysis(design.data);
  return <DesignDrawingPanel data={design.data} system={system} analysis={analysis} />;
}

function DesignLinks({ rideId, editor }: { rideId: string; editor: boolean }) {
  return (
    <View style={styles.links}>
      <LinkRow href={rideDesignHref(rideId)} label="All design data and versions" icon="layers" />
      {editor ? <LinkRow href={rideImportHref(rideId)} label="Import or export" icon="upload" /> : null}
    </View>
  );
}

/** A full-width text link with an icon: a 48 px target, for lists of "go to…" inside cards. */
function LinkRow({
  href,
  label,
  icon,
}: {
  href: Href;
  label: string;
  icon: 'layers' | 'upload' | 'edit-3' | 'calendar' | 'list' | 'clock' | 'alert-triangle';
}) {
  return (
    <Link href={href} asChild>
      <Pressable role="link" style={styles.linkRow}>
        <Feather name={icon} size={18} color={colors.accent} />
        <Text variant="heading" color={colors.accent} style={styles.linkText}>
          {label}
        </Text>
        <Feather name="chevron-right" size={18} color={colors.accent} />
      </Pressable>
    </Link>
  );
}

/** Planners see the ride's schedule; inspectors see what is assigned to them on this ride. */
function ScheduleCard({ rideId, role }: { rideId: string; role: Role }) {
  const planner = canEditRides(role);
  const schedules = useRideSchedulesQuery(rideId, planner);
  const mine = useMyAssignmentsQuery(role === 'inspector');
  const query = planner ? schedules : mine;
  const rows = (list: Schedule[]) => (planner ? list : list.filter((s) => s.rideId === rideId));
  return (
    <Card>
      <Text variant="heading">{planner ? 'Inspection schedule' : 'Assigned to you'}</Text>
      {query.isPending ? (
        <Spinner color={colors.base} />
      ) : query.error || !query.data ? (
        <Text muted>The schedule could not be loaded.</Text>
      ) : rows(query.data).length === 0 ? (
        <Text muted>
          {planner ? 'No inspections planned for this ride.' : 'Nothing on this ride is assigned to you.'}
        </Text>
      ) : (
        rows(query.data).map((s) => <ScheduleLine key={s.id} schedule={s} />)
      )}
      {planner ? <LinkRow href={rideScheduleHref(rideId)} label="Plan and assign" icon="calendar" /> : null}
    </Card>
  );
}

/** Reports shown on the ride's page; the rest are on the ride's incident reports page. */
const RECENT_INCIDENTS = 3;

/**
 * The ride's latest incident reports (its operator's), each leading to the report; the operator reports a
 * new one from here.
 */
function IncidentsCard({ rideId, operator }: { rideId: string; operator: boolean }) {
  const query = useRideIncidents(rideId);
  const list = query.data?.incidents ?? [];
  return (
    <Card accessibilityLabel="Incident reports">
      <Text variant="heading">Incident reports</Text>
      {query.isPending ? (
        <Spinner color={colors.base} />
      ) : query.error || !query.data ? (
        <Text muted>The incident reports could not be loaded.</Text>
      ) : list.length === 0 ? (
        <Text muted>No incidents reported on this ride.</Text>
      ) : (
        list.slice(0, RECENT_INCIDENTS).map((i) => <IncidentRow key={i.id} incident={i} />)
      )}
      {operator ? (
        <LinkRow href={rideIncidentNewHref(rideId)} label="Report an incident" icon="alert-triangle" />
      ) : null}
      {list.length > 0 ? (
        <LinkRow
          href={rideIncidentsHref(rideId)}
          label={`All incident reports (${list.length})`}
          icon="list"
        />
      ) : null}
    </Card>
  );
}

/** The notices issued to the ride's operator about this ride, newest first, each leading to the notice. */
function NoticesCard({ rideId }: { rideId: string }) {
  const query = useRideNotices(rideId);
  return (
    <Card accessibilityLabel="Notices">
      <Text variant="heading">Notices</Text>
      {query.isPending ? (
        <Spinner color={colors.base} />
      ) : query.error || !query.data ? (
        <Text muted>The notices could not be loaded.</Text>
      ) : query.data.notices.length === 0 ? (
        <Text muted>
          No notices yet. One is issued to the operator when an inspection with findings is approved or the
          ride’s status changes.
        </Text>
      ) : (
        <>
          {query.data.notices.map((n) => (
            <NoticeRow key={n.id} notice={n} />
          ))}
          {query.data.total > query.data.notices.length ? (
            <Text variant="small" muted>
              The newest {RIDE_NOTICES_PAGE} of {query.data.total} notices.
            </Text>
          ) : null}
        </>
      )}
    </Card>
  );
}

function ScheduleLine({ schedule: s }: { schedule: Schedule }) {
  return (
    <View style={styles.scheduleLine}>
      <View style={styles.scheduleText}>
        <Text variant="heading">{inspectionTypeLabel[s.inspectionType]}</Text>
        <Text variant="small" muted>
          {s.nextDueOn ? `${formatDate(s.nextDueOn)} · ${dueInWords(s.daysUntilDue)}` : 'No date set'}
          {' · '}
          {s.assignedTo ? s.assignedTo.name : 'Not assigned'}
        </Text>
      </View>
      <DueMark status={s.dueStatus} />
    </View>
  );
}

const styles = StyleSheet.create({
  pair: { flexDirection: 'row', gap: space.xl },
  stack: { gap: space.lg, maxWidth: 640 },
  start: { alignSelf: 'flex-start' },
  links: { gap: 0 },
  linkRow: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
  },
  linkText: { flex: 1 },
  scheduleLine: {
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.md,
    paddingVertical: space.xs,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  scheduleText: { flexShrink: 1, gap: 2 },
});
