import { useQueries } from '@tanstack/react-query';
import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { LinkCard } from '@/components/link-card';
import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { StatRow, StatTile } from '@/components/stat-tile';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import {
  noticeKeys,
  noticeHref,
  noticesHref,
  isPastDue,
  noticeKindLabel,
  todayIso,
} from '@/features/notices';
import { fetchNotice, useNoticeList, FindingStateMark, SeverityMark } from '@/features/notices/ui';
import type { NoticeFinding, NoticeListItem } from '@/features/notices/schema';
import { formatDate } from '@/lib/dates';
import { rideIncidentNewHref, useRidesQuery } from '@/features/rides';
import { RideGrid } from '@/features/rides/ui';
import { useFirstScreenSettled } from '@/components/first-screen';
import { DailyOverviewCard } from '@/features/daily-checks/ui';

/** Enough to hold every notice an operator company has open at once. */
const NOTICES_PAGE = 100;
/** Notices with open findings whose findings are read for the list of what is due (newest first). */
const MAX_NOTICES_READ = 12;

type OpenFinding = NoticeFinding & { noticeId: string; noticeReference: string; rideName: string };

/**
 * The operator's start page (/my-rides): first the notices waiting for the company's acknowledgement,
 * then the findings still open with their due dates (soonest first), then the company's rides and the
 * status the inspection body has set.
 */
export function OperatorHome() {
  return (
    <RoleGate roles={['operator']}>
      {(user) => (
        <Screen title="My rides" subtitle={user.companyName ?? undefined}>
          <DailyOverviewCard />
          <OperatorNotices />
          <OperatorRides />
        </Screen>
      )}
    </RoleGate>
  );
}

function OperatorNotices() {
  const list = useNoticeList({ pageSize: NOTICES_PAGE });
  useFirstScreenSettled(!list.isPending);
  const notices = list.data?.notices ?? [];
  const awaiting = notices.filter((n) => n.acknowledgedAt === null);
  // The findings as they stand now come with each notice; one finding may be on more than one notice.
  const withOpen = notices.filter((n) => n.openFindings > 0).slice(0, MAX_NOTICES_READ);
  const details = useQueries({
    queries: withOpen.map((n) => ({
      queryKey: noticeKeys.detail(n.id),
      queryFn: ({ signal }) => fetchNotice(n.id, signal),
      staleTime: 15 * 1000,
    })),
  });
  const seen = new Set<string>();
  const open: OpenFinding[] = [];
  for (const d of details) {
    if (!d.data) continue;
    for (const f of d.data.findings) {
      if (f.state === 'closed' || seen.has(f.id)) continue;
      seen.add(f.id);
      open.push({ ...f, noticeId: d.data.id, noticeReference: d.data.reference, rideName: d.data.rideName });
    }
  }
  // Soonest due first; findings without a due date after those with one.
  open.sort(
    (a, b) => (a.dueOn ?? '9999-12-31').localeCompare(b.dueOn ?? '9999-12-31') || a.number - b.number,
  );
  const loadingFindings = details.some((d) => d.isPending);

  if (list.isPending || list.error) {
    return <QueryState query={list}>{() => null}</QueryState>;
  }
  return (
    <>
      {awaiting.length > 0 ? (
        <View style={styles.section}>
          <SectionTitle>{`Notices awaiting your acknowledgement (${awaiting.length})`}</SectionTitle>
          <View style={styles.list}>
            {awaiting.map((n) => (
              <AwaitingCard key={n.id} notice={n} />
            ))}
          </View>
        </View>
      ) : null}
      {withOpen.length > 0 ? (
        <View style={styles.section}>
          <SectionTitle>{`Open findings${open.length > 0 ? ` (${open.length})` : ''}`}</SectionTitle>
          {open.length === 0 && loadingFindings ? (
            <Text muted>Loading the open findings…</Text>
          ) : (
            <View style={styles.list} role="list" accessibilityLabel="Open findings">
              {open.map((f) => (
                <View key={f.id} role="listitem">
                  <OpenFindingRow finding={f} />
                </View>
              ))}
            </View>
          )}
        </View>
      ) : null}
      {awaiting.length === 0 && withOpen.length === 0 ? (
        <View style={styles.allClear}>
          <Feather name="check-circle" size={18} color={colors.within} />
          <Text>
            {notices.length === 0
              ? 'No notices yet.'
              : 'Every notice is acknowledged and no finding is open.'}
          </Text>
          <Link href={noticesHref} asChild>
            <Pressable role="link" style={styles.inlineLink}>
              <Text variant="heading" color={colors.accent}>
                All notices
              </Text>
            </Pressable>
          </Link>
        </View>
      ) : null}
    </>
  );
}

function AwaitingCard({ notice: n }: { notice: NoticeListItem }) {
  return (
    <LinkCard
      href={noticeHref(n.id)}
      label={`Notice ${n.reference}, ${n.rideName}: awaiting your acknowledgement`}
      title={
        <Text variant="heading">
          {n.reference} · {n.rideName}
        </Text>
      }
      plain
      style={StyleSheet.flatten([styles.row, styles.awaiting])}
    >
      {(title) => (
        <>
          <Feather name="file-text" size={22} color={colors.accent} />
          <View style={styles.rowText}>
            {title}
            <Text variant="small" muted>
              {noticeKindLabel[n.kind]} · issued {formatDate(n.issuedAt)}
              {n.findingsTotal > 0
                ? ` · ${n.findingsTotal} ${n.findingsTotal === 1 ? 'finding' : 'findings'}`
                : ''}
            </Text>
            <Text variant="label" color={colors.accent}>
              Read and acknowledge ›
            </Text>
          </View>
        </>
      )}
    </LinkCard>
  );
}

function OpenFindingRow({ finding: f }: { finding: OpenFinding }) {
  const wide = useWide();
  const pastDue = isPastDue(f, todayIso());
  return (
    <LinkCard
      href={noticeHref(f.noticeId)}
      label={`${f.rideName}, finding ${f.number}: ${f.dueOn ? `due ${formatDate(f.dueOn)}` : 'no due date'}${pastDue ? ', past due' : ''}`}
      title={
        <Text variant="heading">
          {f.rideName}, finding {f.number}
        </Text>
      }
      plain
      style={StyleSheet.flatten([styles.row, pastDue && styles.pastDue])}
    >
      {(title) => (
        <>
          <View style={wide ? styles.dueWide : styles.due}>
            <Text variant="label" muted>
              DUE
            </Text>
            <Text variant="figure" color={pastDue ? colors.danger : colors.text}>
              {f.dueOn ? formatDate(f.dueOn) : 'No date'}
            </Text>
            {pastDue ? (
              <Text variant="label" color={colors.danger}>
                PAST DUE
              </Text>
            ) : null}
          </View>
          <View style={styles.rowText}>
            {title}
            <View style={styles.marks}>
              <SeverityMark severity={f.severity} compact />
              <FindingStateMark state={f.state} />
            </View>
            <Text variant="small" numberOfLines={2}>
              {f.requiredAction ?? f.description}
            </Text>
            <Text variant="small" muted>
              On notice {f.noticeReference}
            </Text>
          </View>
        </>
      )}
    </LinkCard>
  );
}

function OperatorRides() {
  const rides = useRidesQuery();
  return (
    <QueryState query={rides} empty={(r) => r.length === 0}>
      {(list) => (
        <>
          <StatRow>
            <StatTile value={list.length} label="Rides" />
            <StatTile value={list.filter((r) => r.status === 'in_service').length} label="In service" />
            <StatTile
              value={list.filter((r) => r.status !== 'in_service').length}
              label="Restricted or stopped"
            />
          </StatRow>
          <SectionTitle>Rides and their status</SectionTitle>
          <RideGrid rides={list} showOperator={false} />
          <SectionTitle>Report an incident</SectionTitle>
          <Text variant="small" muted>
            Someone hurt or something damaged, a near miss, or an unplanned stop: report it on the ride, with
            photos. You may take the ride out of service with the report.
          </Text>
          <View style={styles.list} role="list" accessibilityLabel="Report an incident on a ride">
            {list.map((r) => (
              <View key={r.id} role="listitem">
                <Link href={rideIncidentNewHref(r.id)} asChild>
                  <Pressable role="link" style={styles.reportLink}>
                    <Feather name="alert-triangle" size={18} color={colors.accent} />
                    <Text variant="heading" color={colors.accent} style={styles.rowText}>
                      {`Report an incident on ${r.name}`}
                    </Text>
                    <Feather name="chevron-right" size={18} color={colors.accent} />
                  </Pressable>
                </Link>
              </View>
            ))}
          </View>
        </>
      )}
    </QueryState>
  );
}

const styles = StyleSheet.create({
  section: { gap: space.sm },
  list: { gap: space.sm },
  row: {
    flexDirection: 'row',
    alignItems: 'flex-start',
    gap: space.md,
    padding: space.md,
    minHeight: layout.touchTarget,
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
  },
  awaiting: { borderColor: colors.accent, borderWidth: 2, alignItems: 'center' },
  pastDue: { borderColor: colors.danger, borderLeftWidth: 4 },
  rowText: { flex: 1, gap: 2, minWidth: 0 },
  marks: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs, paddingVertical: 2 },
  due: { width: 104, gap: 2 },
  dueWide: { width: 128, gap: 2 },
  allClear: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  inlineLink: { minHeight: layout.touchTarget, justifyContent: 'center' },
  reportLink: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    backgroundColor: colors.surface,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
  },
});
