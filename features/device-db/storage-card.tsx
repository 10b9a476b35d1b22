/**
 * Storage on this phone, for the Account screen: the room the platform reports, what the phone keeps and
 * why, and "Free space now". Renders nothing where no device database is open (desk roles).
 */
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import type { DeviceDb } from '@/features/device-db/connection';
import type { DeviceHoldings } from '@/features/device-db/holdings';
import { useOptionalDeviceDb } from '@/features/device-db/provider';
import { defaultPrunePolicy } from '@/features/device-db/prune';
import {
  type FreeSpaceResult,
  useDeviceHoldingsQuery,
  useFreeSpaceMutation,
  useStorageSpaceQuery,
} from '@/features/device-db/storage-api';
import { type StorageSpace, isSpaceLow } from '@/features/device-db/storage-space-types';
import { formatBytes } from '@/lib/bytes';

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

export function PhoneStorageCard() {
  const dev = useOptionalDeviceDb();
  return dev ? <StorageCardBody dev={dev} /> : null;
}

function StorageCardBody({ dev }: { dev: DeviceDb }) {
  const space = useStorageSpaceQuery();
  const holdings = useDeviceHoldingsQuery(dev);
  const free = useFreeSpaceMutation(dev);
  return (
    <Card accessibilityLabel="Storage on this phone">
      <Text variant="heading" accessibilityRole="header">
        Storage on this phone
      </Text>
      <SpaceLine space={space.data ?? null} loading={space.isPending} />
      {holdings.data ? <HoldingsList holdings={holdings.data} /> : null}
      {holdings.error ? (
        <Text variant="small" color={colors.over} role="alert">
          What the phone holds could not be read: {holdings.error.message}
        </Text>
      ) : null}
      <Text variant="small" muted>
        Sent inspections and their photos stay {defaultPrunePolicy.keepDays} days after the server took them,
        and for as long as a supervisor&apos;s decision or your correction is awaited; Free space now lets the
        decided ones go at once. Drafts and anything not yet sent are never removed.
      </Text>
      <Button
        label="Free space now"
        tone="quiet"
        icon={<Feather name="trash-2" size={18} color={colors.text} />}
        busy={free.isPending}
        onPress={() => free.mutate()}
        accessibilityHint="Removes sent inspections that are already decided, without waiting"
      />
      {free.data ? <FreeSpaceOutcome result={free.data} /> : null}
      {free.error ? (
        <Text variant="small" color={colors.over} role="alert">
          Nothing was removed: {free.error.message}
        </Text>
      ) : null}
    </Card>
  );
}

function SpaceLine({ space: s, loading }: { space: StorageSpace | null; loading: boolean }) {
  if (loading) return <Text muted>Reading the space left…</Text>;
  if (!s) return <Text muted>This browser does not say how much space is left.</Text>;
  const low = isSpaceLow(s);
  const usedShare = s.usedBytes === null ? null : Math.min(1, s.usedBytes / s.totalBytes);
  return (
    <View style={styles.space}>
      <Text variant="figure">
        {formatBytes(s.availableBytes)} free of {formatBytes(s.totalBytes)}
      </Text>
      {usedShare !== null ? (
        <View style={styles.meterTrack} accessibilityElementsHidden importantForAccessibility="no">
          <View
            style={[
              styles.meterFill,
              { width: `${Math.max(1, usedShare * 100)}%`, backgroundColor: low ? colors.near : colors.base },
            ]}
          />
        </View>
      ) : null}
      {s.usedBytes !== null ? (
        <Text variant="small" muted>
          Pivotwatch uses {formatBytes(s.usedBytes)} in this browser.
        </Text>
      ) : null}
      {low ? (
        <View style={styles.low} role="alert">
          <Feather name="alert-triangle" size={16} color={colors.near} />
          <Text variant="small" color={colors.near} style={styles.grow}>
            Low space. Send what is waiting while you have signal, then free space here.
          </Text>
        </View>
      ) : null}
      <PersistenceLine persistence={s.persistence} />
    </View>
  );
}

function PersistenceLine({ persistence }: { persistence: StorageSpace['persistence'] }) {
  if (persistence === 'persisted')
    return (
      <Text variant="small" muted>
        The browser has agreed to keep this data; it will not clear it to make room.
      </Text>
    );
  if (persistence === 'best_effort')
    return (
      <Text variant="small" color={colors.near}>
        The browser may clear this data when the phone runs short of space. Send your inspections often;
        adding Pivotwatch to the home screen makes the browser more likely to keep it.
      </Text>
    );
  return null;
}

function HoldingsList({ holdings: h }: { holdings: DeviceHoldings }) {
  const rows: [string, string][] = [
    ['Drafts', `${plural(h.drafts.count, 'draft')} · ${formatBytes(h.drafts.bytes)}`],
    [
      'Not yet sent',
      `${plural(h.unsentRecords.count, 'inspection')}, ${plural(h.unsentPhotos.count, 'photo')} · ${formatBytes(
        h.unsentRecords.bytes + h.unsentPhotos.bytes,
      )}`,
    ],
    [
      'Sent, kept for reference',
      `${plural(h.sentRecords.count, 'inspection')}, ${plural(h.sentPhotos.count, 'photo')} · ${formatBytes(
        h.sentRecords.bytes + h.sentPhotos.bytes,
      )}`,
    ],
    ...(h.keptForOthers.count > 0
      ? ([
          [
            'Kept for someone else',
            `${plural(h.keptForOthers.count, 'unsent item')} · ${formatBytes(h.keptForOthers.bytes)} (sent when its author signs in)`,
          ],
        ] as [string, string][])
      : []),
    [
      'Database file',
      `${formatBytes(h.fileBytes)}${h.freeBytes > 0 ? ` (${formatBytes(h.freeBytes)} of it reusable)` : ''}`,
    ],
  ];
  return (
    <View style={styles.list}>
      {rows.map(([label, value]) => (
        <View key={label} style={styles.row}>
          <Text variant="small" muted style={styles.rowLabel}>
            {label}
          </Text>
          <Text variant="small" style={styles.grow}>
            {value}
          </Text>
        </View>
      ))}
    </View>
  );
}

function FreeSpaceOutcome({ result: r }: { result: FreeSpaceResult }) {
  const removed =
    r.records + r.photos === 0
      ? 'Nothing more can go yet: what is left is waiting to send, awaiting a decision or a correction, or used by a draft.'
      : `Removed ${plural(r.records, 'sent inspection')} and ${plural(r.photos, 'photo')} (${formatBytes(r.photoBytes)} of photos). Nothing waiting to send was touched.`;
  return (
    <View role="status" accessibilityLiveRegion="polite" style={styles.outcome}>
      <Text variant="small">{removed}</Text>
      {r.compactError ? (
        <Text variant="small" muted>
          The database file could not be compacted now ({r.compactError}); the freed room is reused for new
          inspections.
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  space: { gap: space.xs },
  meterTrack: {
    height: 10,
    borderRadius: radius.sm,
    backgroundColor: colors.surfaceSunk,
    overflow: 'hidden',
  },
  meterFill: { height: '100%', borderRadius: radius.sm },
  low: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    padding: space.sm,
    borderRadius: radius.sm,
    backgroundColor: colors.nearSoft,
  },
  list: { gap: space.xs, paddingVertical: space.xs },
  row: { flexDirection: 'row', gap: space.md, flexWrap: 'wrap' },
  rowLabel: { width: 132 },
  grow: { flex: 1, minWidth: 150 },
  outcome: { gap: space.xs },
});
