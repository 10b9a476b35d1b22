import { useRouter } from 'expo-router';
import { useEffect, useRef, useState } from 'react';
import { Pressable, StyleSheet, View, useWindowDimensions } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Card } from '@/components/card';
import { LinkCard } from '@/components/link-card';
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
import { rememberQueueOrder } from '@/features/review/queue-order';
import { queueItemHref, queueItemLabel, queueItemWhat } from '@/features/review/queue-text';
import {
  type QueueItem,
  type QueueResponse,
  type Urgency,
  queueQuerySchema,
  urgencies,
  urgencyInfo,
} from '@/features/review/schema';
import { ShortcutHelp } from '@/features/review/shortcut-help';
import { stepIndex } from '@/features/review/shortcuts';
import { UrgencyIcon, UrgencyMark, urgencyLook } from '@/features/review/urgency-mark';
import { useShortcuts } from '@/features/review/use-shortcuts';
import { rideClassLabel } from '@/features/rides/schema';
import { useFirstScreenSettled } from '@/components/first-screen';

const PAGE_SIZE = 25;
/** From this window width the table has room for columns of their own for the load check and the counts. */
const ROOMY_FROM = 1280;
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
 * Desktop: one dense table. Phone: the same items as cards. On the web, keys move a highlight through
 * the page's items and open one (`features/review/shortcuts.ts`).
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
  const keys = useQueueKeys(queue.data?.items);
  useFirstScreenSettled(!queue.isPending);

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
    <Screen
      title="Review"
      subtitle="What needs a supervisor’s eye, most urgent first."
      actions={<ShortcutHelp page="queue" open={keys.helpOpen} onOpenChange={keys.setHelpOpen} />}
    >
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
                <Spinner color={colors.base} size="small" />
              </View>
            ) : null}
            {page.items.length === 0 ? (
              <EmptyQueue narrowed={narrowed} onClear={clear} />
            ) : wide ? (
              <QueueTable items={page.items} highlighted={keys.highlighted} />
            ) : (
              <View style={styles.cards}>
                {page.items.map((item, i) => (
                  <QueueCard key={item.key} item={item} highlighted={i === keys.highlighted} />
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

/**
 * The queue's keys: a highlight that j/k (or the arrows) move through the page's items, Enter or o to open
 * the highlighted one, ? for the list of keys. The highlight follows the item, not its place, so a
 * refreshed page keeps it; the page's inspections are remembered in order for j/k on an inspection.
 */
function useQueueKeys(items: readonly QueueItem[] | undefined) {
  const router = useRouter();
  const [helpOpen, setHelpOpen] = useState(false);
  const [highlightedKey, setHighlightedKey] = useState<string | null>(null);
  const list = items ?? [];
  const highlighted = list.findIndex((i) => i.key === highlightedKey);
  useEffect(() => {
    if (items)
      rememberQueueOrder(
        items.flatMap((i) => (i.kind === 'inspection' && i.inspectionId ? [i.inspectionId] : [])),
      );
  }, [items]);
  const move = (step: 1 | -1) => {
    const to = stepIndex(highlighted, list.length, step);
    if (to >= 0) setHighlightedKey(list[to].key);
  };
  useShortcuts(
    'queue',
    helpOpen
      ? { help: () => setHelpOpen(false) }
      : {
          next: () => move(1),
          previous: () => move(-1),
          open: () => {
            if (highlighted >= 0) router.push(queueItemHref(list[highlighted]));
          },
          help: () => setHelpOpen(true),
        },
  );
  return { highlighted, helpOpen, setHelpOpen };
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
      // Named count first, as drawn (WCAG 2.5.3, label in name).
      accessibilityLabel={`${value ?? 'loading'} ${label}${on ? ', shown' : ''}`}
      accessibilityHint={hint}
      onPress={onPress}
      style={StyleSheet.flatten([styles.tile, on && styles.tileOn, value === 0 && !on && styles.tileZero])}
    >
      {/* The space keeps the count and the words apart in the text a page reader takes ("1 Over limit"),
          as in the name; it draws nothing at the end of its line. */}
      <Text variant="figureLarge" color={value ? color : colors.textMuted}>
        {`${value ?? '–'} `}
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

/** Names wrap whole (never cut short): a long site or operator takes a second line, not an ellipsis. */
/** The ride's name: the row's link (its class, and on a narrower desk where it is, sit under it). */
const rideName = (item: QueueItem) => <Text variant="heading">{item.rideName}</Text>;

function RideDetail({ item, where }: { item: QueueItem; where?: boolean }) {
  return (
    <View>
      <Text variant="small" muted>
        {rideClassLabel[item.rideClass]}
      </Text>
      {where ? <WhereLines item={item} /> : null}
    </View>
  );
}

function WhereLines({ item }: { item: QueueItem }) {
  return (
    <>
      <Text>{item.siteName ?? 'No site'}</Text>
      <Text variant="small" muted>
        {item.operatorName}
      </Text>
    </>
  );
}

/** A date on one line, in the one date format; its column is wide enough for the longest ("30 Sep 2026"). */
function DateCell({ value }: { value: string | null }) {
  return (
    <Text variant="figure" numberOfLines={1} style={styles.right}>
      {value ? formatDate(value) : dash}
    </Text>
  );
}

/** The item in words, whole; with the facts whose columns the table has no room for. */
function WhatCell({ item, counts }: { item: QueueItem; counts?: boolean }) {
  const facts = [
    queueItemWhat(item),
    // A ride's own words already say since when it is overdue; an inspection's do not.
    item.kind === 'inspection' && item.overdueSince
      ? `Ride overdue since ${formatDate(item.overdueSince)}`
      : null,
    counts && item.failedItems > 0 ? `${item.failedItems} failed` : null,
    counts && item.findingsPastDue > 0 && item.kind === 'inspection'
      ? `${item.findingsPastDue} past due`
      : null,
  ].filter(Boolean);
  return <Text>{facts.join(' · ')}</Text>;
}

function UrgencyCell({ item, withAnalysis }: { item: QueueItem; withAnalysis?: boolean }) {
  return (
    <View style={styles.marks}>
      <UrgencyMark urgency={item.urgency} compact />
      {withAnalysis && item.analysisStatus ? <EnvelopeMark status={item.analysisStatus} compact /> : null}
    </View>
  );
}

// Widths (px) the columns never shrink below: a date in the figure font is 11 glyphs of ~9.6 px plus the
// cell's padding; a mark's column fits its widest badge ("Findings past due" may take two lines).
const DATE_WIDTH = 124;
const MARK_WIDTH = 140;

type Column = {
  key: string;
  title: string;
  flex?: number;
  minWidth?: number;
  numeric?: boolean;
  render: (i: QueueItem) => React.ReactNode;
  detail?: (i: QueueItem) => React.ReactNode;
};

/**
 * The desk's table. From ROOMY_FROM: urgency, ride, site and operator, what, date, load check and the two
 * counts, each in a column that keeps its words whole. Narrower (1024 px): ride, site and operator share
 * a cell, the load check sits under the urgency, and the counts join the words under "What".
 */
function QueueTable({ items, highlighted }: { items: QueueItem[]; highlighted: number }) {
  const roomy = useWindowDimensions().width >= ROOMY_FROM;
  const date: Column = {
    key: 'date',
    title: 'Date',
    flex: 0.01,
    minWidth: DATE_WIDTH,
    numeric: true,
    render: (i) => <DateCell value={i.day || i.at} />,
  };
  const columns: Column[] = roomy
    ? [
        {
          key: 'urgency',
          title: 'Urgency',
          flex: 0.01,
          minWidth: MARK_WIDTH,
          render: (i) => <UrgencyCell item={i} />,
        },
        {
          key: 'ride',
          title: 'Ride',
          flex: 1,
          render: rideName,
          detail: (i) => <RideDetail item={i} />,
        },
        { key: 'where', title: 'Site · operator', flex: 1.25, render: (i) => <WhereLines item={i} /> },
        { key: 'what', title: 'What', flex: 1.7, render: (i) => <WhatCell item={i} /> },
        date,
        {
          key: 'analysis',
          title: 'Load check',
          flex: 0.01,
          minWidth: 118,
          render: (i) => (i.analysisStatus ? <EnvelopeMark status={i.analysisStatus} compact /> : dash),
        },
        {
          key: 'failed',
          title: 'Failed',
          flex: 0.01,
          minWidth: 72,
          numeric: true,
          render: (i) => countOrDash(i.failedItems),
        },
        {
          key: 'pastDue',
          title: 'Past due',
          flex: 0.01,
          minWidth: 84,
          numeric: true,
          render: (i) => countOrDash(i.findingsPastDue),
        },
      ]
    : [
        {
          key: 'urgency',
          title: 'Urgency · load check',
          flex: 0.01,
          minWidth: MARK_WIDTH,
          render: (i) => <UrgencyCell item={i} withAnalysis />,
        },
        {
          key: 'ride',
          title: 'Ride · site · operator',
          flex: 1,
          render: rideName,
          detail: (i) => <RideDetail item={i} where />,
        },
        { key: 'what', title: 'What', flex: 1.4, render: (i) => <WhatCell item={i} counts /> },
        date,
      ];
  return (
    <SortableTable<QueueItem, never>
      label="Review queue"
      rows={items}
      rowKey={(i) => i.key}
      rowHref={queueItemHref}
      rowLabel={queueItemLabel}
      linkColumn="ride"
      highlighted={highlighted}
      columns={columns}
    />
  );
}

/** Phone: one card per item, its ride's name the link (a tap anywhere on it follows it); a narrow desk window gets the cards too. */
function QueueCard({ item, highlighted }: { item: QueueItem; highlighted: boolean }) {
  const ref = useRef<View>(null);
  useEffect(() => {
    // A card the keys moved to takes the focus, which brings it into view (on the web, the only place
    // the keys are read).
    if (highlighted) (ref.current as unknown as { focus?: () => void } | null)?.focus?.();
  }, [highlighted]);
  const facts = [
    item.failedItems > 0 ? `${item.failedItems} failed` : null,
    item.findingsPastDue > 0 && item.kind === 'inspection' ? `${item.findingsPastDue} past due` : null,
  ].filter(Boolean);
  return (
    <LinkCard
      href={queueItemHref(item)}
      label={queueItemLabel(item)}
      title={<Text variant="heading">{item.rideName}</Text>}
      linkRef={ref}
      current={highlighted}
      plain
      style={StyleSheet.flatten([styles.card, highlighted && styles.cardHighlighted])}
    >
      {(rideName) => (
        <>
          <View style={styles.cardHead}>
            <UrgencyMark urgency={item.urgency} />
            <Text variant="figure" muted>
              {formatDate(item.day || item.at)}
            </Text>
          </View>
          <View style={styles.shrink}>
            {rideName}
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
              {item.kind === 'inspection'
                ? 'Review inspection'
                : item.kind === 'incident'
                  ? 'Open report'
                  : 'Open ride'}
            </Text>
            <Feather name="chevron-right" size={16} color={colors.accent} />
          </View>
        </>
      )}
    </LinkCard>
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
  // An empty tile is drawn quieter by its frame, not by fading it: its words keep their contrast (WCAG 1.4.3).
  tileZero: { borderStyle: 'dashed' },
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
  // A thicker frame as well as the tint: the highlight is not shown by colour alone.
  cardHighlighted: {
    backgroundColor: colors.infoSoft,
    borderColor: colors.focus,
    borderWidth: 3,
    padding: space.lg - 2,
  },
  right: { textAlign: 'right' },
  marks: { gap: space.xs, alignItems: 'flex-start' },
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
