import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { DataTable } from '@/components/data-table';
import Feather from '@/components/feather-icon';
import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import {
  FORCE_RANGE_TITLE,
  RANGES_NOTE,
  TORQUE_RANGE_TITLE,
  forceRangeText,
  formatValue,
  measuredSources,
  rangesNotRecorded,
  torqueRangeText,
} from '@/features/loads';
import { CycleWarnings, EnvelopeTable } from '@/features/loads/ui';
import { measuredWithWords } from '@/features/instruments/schema';
import { formatDateTime } from '@/lib/dates';
import { plausibilityText } from '@/features/records';
import type {
  InspectionDetail,
  InspectionReading,
  StoredAnalysisView,
} from '@/features/review/inspection-schema';
import { formatReading, formatSpread, pivotName } from '@/features/review/review-format';
import { readingKindLabel } from '@/features/records/schema';
import type { UnitSystem } from '@/lib/units';

const headline = {
  within: 'Every checked value is within the design envelope.',
  near: 'Some values are near their limits.',
  over: 'Values are over their limits: the ride calls for your stop and lockout/tagout procedure.',
} as const;

/**
 * The server's load check of the inspection: the worst status in words, every checked value against its
 * limit (ratio and status, worst first) and the peak load on each pivot, with the caution beside them.
 */
export function LimitsSection({
  inspection,
  pivots,
  system,
}: {
  inspection: InspectionDetail;
  pivots: readonly string[];
  system: UnitSystem;
}) {
  const a = inspection.analysis;
  const freePin = (joint: number) =>
    a?.models?.some((m) => m.joint === joint && m.model === 'free_swing') ?? false;
  if (!a) {
    return (
      <Card>
        <Text variant="heading">No load check</Text>
        <Text muted>
          {inspection.analysisNote ??
            (inspection.analysedAt
              ? 'The server could not analyse this inspection.'
              : 'The server has not analysed this inspection yet. Reload in a moment.')}
        </Text>
      </Card>
    );
  }
  return (
    <View style={styles.section}>
      <Card style={styles.headline}>
        {a.status ? <EnvelopeMark status={a.status} /> : null}
        <Text variant="heading">
          {a.status ? headline[a.status] : 'The design data gives no limits: loads only, no statuses.'}
        </Text>
      </Card>
      <CycleWarnings
        warnings={a.warnings}
        jointNames={a.joints.map((j) => j.name)}
        seatNames={a.seats.map((x) => x.name)}
      />
      <ConfirmedOutOfRange items={a.confirmedOutOfRange ?? []} />
      {a.envelope.length > 0 ? (
        <EnvelopeTable
          items={a.envelope}
          system={system}
          sources={measuredSources({ readings: inspection.readings, checklist: inspection.record.checklist })}
        />
      ) : null}
      <DataTable
        label="Peak pivot loads"
        rows={a.joints.map((j, i) => ({ j, i }))}
        rowKey={({ i }) => String(i)}
        columns={[
          {
            key: 'pivot',
            title: 'Pivot',
            render: ({ i, j }) => pivotName(i, pivots.length ? pivots : [j.name]),
            flex: 1.6,
          },
          {
            key: 'peak',
            title: 'Peak force',
            render: ({ j }) => formatValue(j.peakForceN, 'force', system),
            numeric: true,
          },
          {
            key: 'angle',
            title: 'At arm angle',
            render: ({ j }) => formatValue(wrapAngle(j.peakForceAtArmAngleRad), 'angle', system),
            numeric: true,
          },
          {
            key: 'range',
            title: FORCE_RANGE_TITLE,
            // Older analyses kept only the range of the force's size, which hides a reversal: not shown.
            render: ({ j }) =>
              j.ranges ? forceRangeText(j.ranges, system) : rangesNotRecorded(a.engineVersion),
            numeric: true,
            flex: 1.8,
          },
          {
            key: 'torque',
            title: 'Peak torque',
            // A free pin carries no torque; what the integration leaves is round-off, not a value to read.
            render: ({ i, j }) =>
              freePin(i) ? 'None: free pin' : formatValue(Math.abs(j.peakTorqueNm), 'moment', system),
            numeric: true,
          },
          {
            key: 'torqueRange',
            title: TORQUE_RANGE_TITLE,
            render: ({ i, j }) =>
              freePin(i)
                ? 'None: free pin'
                : j.ranges
                  ? torqueRangeText(j.ranges, system)
                  : rangesNotRecorded(a.engineVersion),
            numeric: true,
          },
        ]}
      />
      <Text variant="small" muted>
        {RANGES_NOTE}
      </Text>
      <Caution />
    </View>
  );
}

/**
 * Motion readings the inspector kept although they were far from the design motion: the load check above
 * rests on them (where `usedByLoadCheck`), so the reviewer sees that first, with the inspector's reason.
 */
export function ConfirmedOutOfRange({
  items,
}: {
  items: NonNullable<StoredAnalysisView['confirmedOutOfRange']>;
}) {
  if (items.length === 0) return null;
  return (
    <Card style={styles.confirmed} accessibilityLabel="Readings confirmed far from the design motion">
      <View style={styles.confirmedHead}>
        <Feather name="alert-triangle" size={18} color={colors.near} />
        <Text variant="heading" color={colors.near} style={styles.grow}>
          The inspector kept {items.length === 1 ? 'a reading' : `${items.length} readings`} far from the
          design motion
        </Text>
      </View>
      {items.map((c) => (
        <Text key={c.readingId}>
          {c.label}: {plausibilityText({ ...c, plausible: false })}
          {c.usedByLoadCheck ? ' · used by this load check' : ' · replaced by a later reading'}
          {c.note ? ` · “${c.note}”` : ''}
        </Text>
      ))}
    </Card>
  );
}

/** The readings exactly as taken: value with its unit (in the person's system), spread, method, time. */
export function ReadingsTable({
  readings,
  pivots,
  system,
}: {
  readings: InspectionReading[];
  pivots: readonly string[];
  system: UnitSystem;
}) {
  if (readings.length === 0) return <Text muted>No readings were taken.</Text>;
  // By pivot, then in the order they were taken.
  const rows = [...readings].sort((a, b) => (a.joint ?? 99) - (b.joint ?? 99));
  return (
    <DataTable
      label="Readings"
      rows={rows}
      rowKey={(r) => r.id}
      columns={[
        {
          key: 'what',
          title: 'Reading',
          render: (r) => (r.label ? r.label : readingKindLabel[r.kind]),
          flex: 1.6,
        },
        {
          key: 'pivot',
          title: 'Pivot',
          render: (r) => (r.joint === null ? '—' : pivotName(r.joint, pivots)),
          flex: 1.3,
        },
        {
          key: 'value',
          title: 'Value',
          render: (r) => {
            const spread = formatSpread(r, system);
            return spread ? `${formatReading(r, system)} ${spread}` : formatReading(r, system);
          },
          numeric: true,
          flex: 1.3,
        },
        {
          key: 'method',
          title: 'Method',
          render: (r) => (r.note ? `${measuredWithWords(r)} · ${r.note}` : measuredWithWords(r)),
          flex: 1.3,
        },
        { key: 'at', title: 'Taken', render: (r) => formatDateTime(r.takenAt), flex: 1.1 },
      ]}
    />
  );
}

function wrapAngle(rad: number): number {
  const full = 2 * Math.PI;
  return ((rad % full) + full) % full;
}

const styles = StyleSheet.create({
  section: { gap: space.md },
  headline: { gap: space.sm },
  confirmed: { gap: space.xs, borderColor: colors.near, borderWidth: 2, borderRadius: radius.lg },
  confirmedHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  grow: { flex: 1 },
});
