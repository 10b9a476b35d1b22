import { Link } from 'expo-router';
import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { CAUTION_SHORT } from '@/components/caution';
import Feather from '@/components/feather-icon';
import { Screen } from '@/components/screen';
import { SortableTable } from '@/components/sortable-table';
import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import { SelfApprovalCard } from '@/features/review/self-approval-card';
import { PagedList } from '@/components/paged-list';
import { formatDate } from '@/lib/dates';
import { useListParams, useSearchText } from '@/components/use-list-params';
import { useReviewQueue } from '@/features/review/queue-api';
import { QueueFilterPanel, activeFilterCount } from '@/features/review/queue-filters';
import { queueItemHref, queueItemLabel, queueItemWhat } from '@/features/review/queue-text';
import {
  type QueueItem,
  type QueueResponse,
  type Urgency,
  queueQuerySchema,
  urgencies,
  urgencyInfo,
} from '@/features/review/schema';
import { UrgencyIcon, UrgencyMark, urgencyLook } from '@/features/review/urgency-mark';
import { rideClassLabel } from '@/features/rides/schema';

const PAGE_SIZE = 25;
const LIST_KEYS = [
  'q',
  'siteId',
  'operatorId',
  'inspectorId',
  'rideClass',
  'rideStatus',
  'urgency',
  'from',
  'to',
  'sort',
  'page',
] as const;

/**
 * The supervisor's start page: everything waiting for a supervisor, most urgent first — submitted
 * inspections and rides whose dates have slipped. Counts per urgency sit on top and filter the list.
 * Search, filters, sort and pages are done by the server (GET /api/review/queue) and kept in the URL.
 * Desktop: one dense table. Phone: the same items as cards.
 */
export function QueueScreen() {
  return (
    <RoleGate roles={['supervisor', 'admin']}>{(user) => <Queue admin={user.role === 'admin'} />}</RoleGate>
  );
}

function Queue({ admin }: { admin: boolean }) {
  const wide = useWide();
  const [query, setQuery] = useListParams(queueQuerySchema, LIST_KEYS);
  // A range given the wrong way round is not sent; the "To" field says why.
  const reversed = !!(query.from && query.to && query.from > query.to);
  const queue = useReviewQueue({ ...query, pageSize: PAGE_SIZE, ...(reversed ? { to: undefined } : {}) });
  const [search, setSearch] = useSearchText(query.q, (q) => setQuery({ q, page: undefined }));

  const chosen = query.urgency ?? [];
  const toggleUrgency = (u: Urgency) =>
    setQuery({
      urgency: chosen.includes(u) ? chosen.filter((c) => c !== u) : [u],
      page: undefined,
    });
  const narrowed = activeFilterCount(query) > 0 || !!query.q || chosen.length > 0;
  const clear = () => {
    setSearch('');
    setQuery({
      q: undefined,
      siteId: undefined,
      operatorId: undefined,
      inspectorId: undefined,
      rideClass: undefined,
      rideStatus: undefined,
      urgency: undefined,
      from: undefined,
      to: undefined,
      page: undefined,
    });
  };

  return (
    <Screen title="Review" subtitle="What needs a supervisor’s eye, most urgent first.">
      <UrgencyTiles
        counts={queue.data?.counts}
        chosen={chosen}
        onToggle={toggleUrgency}
        onAll={() => setQuery({ urgency: undefined, page: undefined })}
      />
      <QueueFilterPanel
        query={query}
        setQuery={setQuery}
        search={search}
        setSearch={setSearch}
        onClear={clear}
      />
      <PagedList
        query={queue}
        noun={(total) => (total === 1 ? 'item' : 'items')}
        setPage={(page) => setQuery({ page })}
      >
        {(page) => (
          <>
            {queue.isFetching ? (
              <View style={styles.fetching} accessibilityLabel="Updating">
                <ActivityIndicator color={colors.base} size="small" />
              </View>
            ) : null}
            {page.items.length === 0 ? (
              <EmptyQueue narrowed={narrowed} onClear={clear} />
            ) : wide ? (
              <QueueTable items={page.items} />
            ) : (
              <View style={styles.cards}>
                {page.items.map((item) => (
                  <QueueCard key={item.key} item={item} />
                ))}
              </View>
            )}
            {page.items.some((i) => i.analysisStatus) ? (
              <Text variant="small" muted>
                {CAUTION_SHORT}
              </Text>
            ) : null}
          </>
        )}
      </PagedList>
      {admin ? <SelfApprovalCard /> : null}
    </Screen>
  );
}

// ——— counts per urgency ———

function UrgencyTiles({
  counts,
  chosen,
  onToggle,
  onAll,
}: {
  counts: QueueResponse['counts'] | undefined;
  chosen: readonly Urgency[];
  onToggle: (u: Urgency) => void;
  onAll: () => void;
}) {
  const total = counts ? urgencies.reduce((sum, u) => sum + counts[u], 0) : null;
  return (
    <View
      style={styles.tiles}
      role="group"
      accessibilityLabel="Items per urgency; press one to show only those"
    >
      <Tile
        value={total}
        label="Everything"
        hint="Show every urgency"
        on={chosen.length === 0}
        onPress={onAll}
        icon={<Feather name="layers" size={14} color={colors.text} />}
      />
      {urgencies.map((u) => (
        <Tile
          key={u}
          value={counts ? counts[u] : null}
          label={urgencyInfo[u].label}
          hint={urgencyInfo[u].description}
          on={chosen.includes(u)}
          onPress={() => onToggle(u)}
          icon={<UrgencyIcon urgency={u} />}
          color={urgencyLook[u].fg}
          soft={urgencyLook[u].bg}
        />
      ))}
    </View>
  );
}

function Tile({
  value,
  label,
  hint,
  on,
  onPress,
  icon,
  color = colors.text,
  soft = colors.surfaceSunk,
}: {
  value: number | null;
  label: string;
  hint: string;
  on: boolean;
  onPress: () => void;
  icon: React.ReactNode;
  color?: string;
  soft?: string;
}) {
  return (
    <Pressable
      role="button"
      aria-pressed={on}
      accessibilityState={{ selected: on }}
      accessibilityLabel={`${label}: ${value ?? 'loading'}${on ? ', shown' : ''}`}
      accessibilityHint={hint}
      onPress={onPress}
      style={StyleSheet.flatten([styles.tile, on && styles.tileOn, value === 0 && !on && styles.tileZero])}
    >
      <Text variant="figureLarge" color={value ? color : colors.textMuted}>
        {value ?? '–'}
      </Text>
      <View style={StyleSheet.flatten([styles.tileLabel, { backgroundColor: soft }])}>
        {icon}
        <Text variant="label" color={color} style={styles.shrink}>
          {label}
        </Text>
      </View>
      {/* The chosen tile says so in words too, not only with its frame. */}
      {on ? (
        <Text variant="small" muted>
          ✓ Shown
        </Text>
      ) : null}
    </Pressable>
  );
}

// ——— the list ———

function EmptyQueue({ narrowed, onClear }: { narrowed: boolean; onClear: () => void }) {
  return (
    <Card style={styles.empty}>
      {narrowed ? (
        <>
          <Text variant="heading">Nothing in the queue matches.</Text>
          <Text muted>Try fewer filters or another search.</Text>
          <Pressable role="button" onPress={onClear} style={styles.emptyAction}>
            <Text variant="heading" color={colors.accent}>
              Show the whole queue
            </Text>
          </Pressable>
        </>
      ) : (
        <>
          <Text variant="heading">The queue is clear.</Text>
          <Text muted>
            No submitted inspection is waiting for sign-off, no ride has an inspection or NDT overdue, no
            finding is past its due date, and no wear is projected past its limit before the next inspection.
          </Text>
        </>
      )}
    </Card>
  );
}

const dash = '—';
const countOrDash = (n: number) => (n > 0 ? String(n) : dash);

function RideCell({ item }: { item: QueueItem }) {
  return (
    <View>
      <Text variant="heading" numberOfLines={1}>
        {item.rideName}
      </Text>
      <Text variant="small" muted numberOfLines={1}>
        {rideClassLabel[item.rideClass]}
      </Text>
    </View>
  );
}

function QueueTable({ items }: { items: QueueItem[] }) {
  return (
    <SortableTable<QueueItem, never>
      label="Review queue"
      rows={items}
      rowKey={(i) => i.key}
      rowHref={queueItemHref}
      rowLabel={queueItemLabel}
      columns={[
        {
          key: 'urgency',
          title: 'Urgency',
          flex: 1.25,
          render: (i) => <UrgencyMark urgency={i.urgency} compact />,
        },
        { key: 'ride', title: 'Ride', flex: 1.4, render: (i) => <RideCell item={i} /> },
        { key: 'site', title: 'Site', flex: 1.1, render: (i) => i.siteName ?? dash },
        { key: 'operator', title: 'Operator', flex: 1.1, render: (i) => i.operatorName },
        { key: 'what', title: 'What', flex: 1.8, render: queueItemWhat },
        { key: 'date', title: 'Date', flex: 0.9, numeric: true, render: (i) => formatDate(i.at) },
        {
          key: 'analysis',
          title: 'Load check',
          flex: 1.05,
          render: (i) => (i.analysisStatus ? <EnvelopeMark status={i.analysisStatus} compact /> : dash),
        },
        {
          key: 'failed',
          title: 'Failed',
          flex: 0.6,
          numeric: true,
          render: (i) => countOrDash(i.failedItems),
        },
        {
          key: 'overdue',
          title: 'Overdue since',
          flex: 0.95,
          numeric: true,
          render: (i) => (i.overdueSince ? formatDate(i.overdueSince) : dash),
        },
        {
          key: 'pastDue',
          title: 'Past due',
          flex: 0.65,
          numeric: true,
          render: (i) => countOrDash(i.findingsPastDue),
        },
      ]}
    />
  );
}

/** Phone: one card per item, the whole card a link. */
function QueueCard({ item }: { item: QueueItem }) {
  const facts = [
    item.failedItems > 0 ? `${item.failedItems} failed` : null,
    item.findingsPastDue > 0 && item.kind === 'inspection' ? `${item.findingsPastDue} past due` : null,
  ].filter(Boolean);
  return (
    <Link href={queueItemHref(item)} asChild>
      <Pressable role="link" accessibilityLabel={queueItemLabel(item)} style={styles.card}>
        <View style={styles.cardHead}>
          <UrgencyMark urgency={item.urgency} />
          <Text variant="figure" muted>
            {formatDate(item.at)}
          </Text>
        </View>
        <View style={styles.shrink}>
          <Text variant="heading">{item.rideName}</Text>
          <Text variant="small" muted>
            {rideClassLabel[item.rideClass]} · {item.siteName ?? 'No site'} · {item.operatorName}
          </Text>
        </View>
        <Text>{queueItemWhat(item)}</Text>
        {item.analysisStatus || facts.length > 0 ? (
          <View style={styles.cardFacts}>
            {item.analysisStatus ? <EnvelopeMark status={item.analysisStatus} compact /> : null}
            {facts.length > 0 ? <Text variant="figure">{facts.join(' · ')}</Text> : null}
          </View>
        ) : null}
        <View style={styles.open}>
          <Text variant="label" color={colors.accent}>
            {item.kind === 'inspection' ? 'Review inspection' : 'Open ride'}
          </Text>
          <Feather name="chevron-right" size={16} color={colors.accent} />
        </View>
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  tiles: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  tile: {
    flexGrow: 1,
    flexBasis: 104,
    minHeight: layout.touchTarget,
    backgroundColor: colors.surface,
    borderColor: colors.border,
    borderWidth: 1.5,
    borderRadius: radius.lg,
    padding: space.md,
    gap: space.xs,
  },
  tileOn: { borderColor: colors.base, borderWidth: 3, padding: space.md - 1.5 },
  tileZero: { opacity: 0.8 },
  tileLabel: {
    flexDirection: 'row',
    alignItems: 'center',
    alignSelf: 'flex-start',
    gap: space.xs + 2,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    borderRadius: radius.sm,
    maxWidth: '100%',
  },
  shrink: { flexShrink: 1 },
  fetching: { position: 'absolute', right: 0, top: -28 },
  cards: { gap: space.md },
  card: {
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
    padding: space.lg,
    gap: space.sm,
    minHeight: layout.touchTarget,
  },
  cardHead: {
    flexDirection: 'row',
    justifyContent: 'space-between',
    alignItems: 'center',
    gap: space.md,
    flexWrap: 'wrap',
  },
  cardFacts: { flexDirection: 'row', alignItems: 'center', gap: space.md, flexWrap: 'wrap' },
  open: { flexDirection: 'row', alignItems: 'center', gap: 2, minHeight: 28 },
  empty: { alignItems: 'flex-start' },
  emptyAction: { minHeight: layout.touchTarget, justifyContent: 'center' },
});
