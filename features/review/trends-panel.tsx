import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { DataTable } from '@/components/data-table';
import { DisclosureToggle } from '@/components/disclosure-toggle';
import { LineChart } from '@/components/line-chart';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { formatBesideLimit } from '@/features/loads';
import { formatMeasured } from '@/lib/measured-format';
import { inspectionTypeLabel } from '@/features/registry/schema';
import { DAY_MS, formatAxisDate, formatDate } from '@/lib/dates';
import { useRideTrends } from '@/features/review/inspection-api';
import { pivotLabel } from '@/features/review/review-format';
import type { TrendPoint, TrendsResponse } from '@/features/review/schema';
import { type QuantityKind, type UnitSystem, fromSI, pickDisplayUnit } from '@/lib/units';

type Measure = 'force' | 'diameter' | 'clearance';
type Joint = TrendsResponse['joints'][number];

const measureSpec: Record<
  Measure,
  {
    title: string;
    quantity: QuantityKind;
    value: (p: TrendPoint, joint: number) => number | null;
    limit: (j: Joint) => { y: number; word: string } | null;
  }
> = {
  force: {
    title: 'Peak force',
    quantity: 'force',
    value: (p, joint) => p.peakForceN[joint] ?? null,
    limit: (j) => (j.maxForceN !== null ? { y: j.maxForceN, word: 'Limit' } : null),
  },
  diameter: {
    title: 'Pin diameter',
    quantity: 'lengthSmall',
    value: (p, joint) => p.pins.find((x) => x.joint === joint)?.diameterM ?? null,
    limit: (j) => (j.minPinDiameterM !== null ? { y: j.minPinDiameterM, word: 'Minimum' } : null),
  },
  clearance: {
    title: 'Bushing clearance',
    quantity: 'lengthSmall',
    value: (p, joint) => p.pins.find((x) => x.joint === joint)?.clearanceM ?? null,
    limit: (j) => (j.maxClearanceM !== null ? { y: j.maxClearanceM, word: 'Maximum' } : null),
  },
};
const measures: Measure[] = ['force', 'diameter', 'clearance'];

/**
 * The ride's inspections over time, per pivot: peak force, pin diameter and clearance against their
 * limits, so a drift shows before it becomes a failure. The inspection under review is marked.
 */
export function TrendsPanel({
  rideId,
  currentId,
  system,
}: {
  rideId: string;
  currentId: string;
  system: UnitSystem;
}) {
  const trends = useRideTrends(rideId);
  if (trends.isPending) return <Spinner color={colors.base} />;
  if (trends.error || !trends.data) {
    return (
      <Card role="alert">
        <Text muted>The ride’s earlier inspections could not be loaded.</Text>
        <Button label="Try again" tone="quiet" onPress={() => trends.refetch()} style={styles.start} />
      </Card>
    );
  }
  const { joints, points } = trends.data;
  if (points.length === 0 || joints.length === 0)
    return <Text muted>No analysed inspections of this ride to compare yet.</Text>;
  return (
    <View style={styles.root}>
      <Text variant="small" muted>
        {points.length === 1
          ? 'This is the only inspection of the ride so far; a trend needs more.'
          : `${points.length} inspections from ${formatDate(points[0].submittedAt)} to ${formatDate(points[points.length - 1].submittedAt)}. The ringed point is this inspection.`}
      </Text>
      {joints.map((j) => (
        <JointTrends key={j.joint} joint={j} points={points} currentId={currentId} system={system} />
      ))}
    </View>
  );
}

function JointTrends({
  joint,
  points,
  currentId,
  system,
}: {
  joint: Joint;
  points: TrendPoint[];
  currentId: string;
  system: UnitSystem;
}) {
  const wide = useWide();
  const [showNumbers, setShowNumbers] = useState(false);
  const name = pivotLabel(joint.joint, joint.name);
  const times = points.map((p) => Date.parse(p.submittedAt));
  const first = Math.min(...times);
  const last = Math.max(...times);
  const domain: [number, number] =
    last > first
      ? [first - (last - first) * 0.04, last + (last - first) * 0.04]
      : [first - DAY_MS, last + DAY_MS];
  const current = points.find((p) => p.inspectionId === currentId);
  const marker = current ? { x: Date.parse(current.submittedAt), label: 'This inspection' } : undefined;
  const tickFormat = (ms: number) => formatAxisDate(ms, last - first);
  const shown = measures.filter((m) => points.some((p) => measureSpec[m].value(p, joint.joint) !== null));
  return (
    <Card accessibilityLabel={`Trends of ${name}`}>
      <Text variant="heading">{name}</Text>
      {shown.length === 0 ? <Text muted>Nothing measured or analysed at this pivot yet.</Text> : null}
      <View style={wide ? styles.rowWide : styles.stack}>
        {shown.map((m) => (
          <MeasureChart
            key={m}
            measure={m}
            joint={joint}
            points={points}
            current={current}
            name={name}
            system={system}
            wide={wide}
            frame={{ times, domain, tickFormat, marker }}
          />
        ))}
      </View>
      {shown.length > 0 ? (
        <DisclosureToggle
          open={showNumbers}
          onToggle={() => setShowNumbers((v) => !v)}
          label={showNumbers ? 'Hide the numbers' : 'Show the numbers'}
        />
      ) : null}
      {showNumbers ? (
        <TrendNumbers
          name={name}
          joint={joint}
          points={points}
          shown={shown}
          currentId={currentId}
          system={system}
        />
      ) : null}
    </Card>
  );
}

/** The time axis all of a pivot's charts share, and where this inspection sits on it. */
type TimeFrame = {
  times: number[];
  domain: [number, number];
  tickFormat: (ms: number) => string;
  marker: { x: number; label: string } | undefined;
};

/** One measure at one pivot over the ride's inspections, against its limit, with its drift in words. */
function MeasureChart({
  measure: m,
  joint,
  points,
  current,
  name,
  system,
  wide,
  frame: { times, domain, tickFormat, marker },
}: {
  measure: Measure;
  joint: Joint;
  points: TrendPoint[];
  current: TrendPoint | undefined;
  name: string;
  system: UnitSystem;
  wide: boolean;
  frame: TimeFrame;
}) {
  const spec = measureSpec[m];
  const values = points.map((p) => spec.value(p, joint.joint));
  const limit = spec.limit(joint);
  const known = values.filter((v): v is number => v !== null);
  const unit = pickDisplayUnit(Math.max(...known, limit?.y ?? 0), spec.quantity, system);
  const toUnit = (v: number) => fromSI(v, spec.quantity, unit.mathjs);
  const thisValue = current ? spec.value(current, joint.joint) : null;
  const bound = limit ? ({ side: limit.word === 'Minimum' ? 'min' : 'max', si: limit.y } as const) : null;
  // Each value is shown against the limit (never rounded across it); measured ones as measured.
  const fmt = (v: number) => formatBesideLimit(v, bound, spec.quantity, system, m !== 'force').value;
  const limitText = limit
    ? (formatBesideLimit(thisValue ?? limit.y, bound, spec.quantity, system, m !== 'force').limit ?? '')
    : '';
  return (
    <View style={wide ? styles.chartWide : undefined}>
      <Text variant="label" muted>
        {spec.title.toUpperCase()}
      </Text>
      <LineChart
        height={180}
        summary={[
          `${spec.title} at ${name}: ${driftWords(points, values, fmt, (v) => formatMeasured(v, spec.quantity, system, m !== 'force' ? { recover: true } : undefined).text)}`,
          limit ? `${limit.word.toLowerCase()} ${limitText}` : 'no limit given',
          thisValue !== null ? `this inspection ${fmt(thisValue)}` : null,
        ]
          .filter(Boolean)
          .join('; ')}
        series={[
          {
            label: spec.title,
            x: times,
            y: values.map((v) => (v === null ? null : toUnit(v))),
            color: colors.base,
            dots: true,
          },
        ]}
        limits={limit ? [{ label: `${limit.word} ${limitText}`, y: toUnit(limit.y) }] : []}
        marker={marker}
        xLabel="Submitted"
        yLabel={unit.label}
        xDomain={domain}
        xTime
        xFormat={tickFormat}
        xValue={(ms) => formatDate(new Date(ms).toISOString())}
        yValue={(v) => `${+v.toPrecision(4)} ${unit.label}`}
        zeroBased={m === 'force'}
      />
      <Text variant="small" muted>
        {driftWords(points, values, fmt)}
      </Text>
    </View>
  );
}

/** The values behind a pivot's charts, newest first, each beside its limit. */
function TrendNumbers({
  name,
  joint,
  points,
  shown,
  currentId,
  system,
}: {
  name: string;
  joint: Joint;
  points: TrendPoint[];
  shown: Measure[];
  currentId: string;
  system: UnitSystem;
}) {
  return (
    <DataTable
      label={`Trend values of ${name}`}
      rows={[...points].reverse()}
      rowKey={(p) => p.inspectionId}
      columns={[
        {
          key: 'when',
          title: 'Inspection',
          render: (p) =>
            `${formatDate(p.submittedAt)} · ${inspectionTypeLabel[p.type]}${p.inspectionId === currentId ? ' (this one)' : ''}`,
          flex: 1.8,
        },
        ...shown.map((m) => ({
          key: m,
          title: measureSpec[m].title,
          render: (p: TrendPoint) => {
            const v = measureSpec[m].value(p, joint.joint);
            if (v === null) return '—';
            const l = measureSpec[m].limit(joint);
            const bound = l ? ({ side: l.word === 'Minimum' ? 'min' : 'max', si: l.y } as const) : null;
            return formatBesideLimit(v, bound, measureSpec[m].quantity, system, m !== 'force').value;
          },
          numeric: true,
        })),
      ]}
    />
  );
}

/** "79.95 mm on 3 Mar 2025 → 79.40 mm on 2 Jun 2025 (−0.55 mm)": the first and latest known values. */
function driftWords(
  points: readonly TrendPoint[],
  values: readonly (number | null)[],
  fmt: (v: number) => string,
  /** The change is no value against a limit: formatted on its own. */
  fmtChange: (v: number) => string = fmt,
): string {
  const known = values
    .map((v, i) => ({ v, at: points[i].submittedAt }))
    .filter((x): x is { v: number; at: string } => x.v !== null);
  if (known.length === 0) return 'no values';
  const a = known[0];
  const b = known[known.length - 1];
  if (known.length === 1) return `${fmt(a.v)} on ${formatDate(a.at)}, the only value`;
  const change = b.v - a.v;
  const sign = change > 0 ? '+' : change < 0 ? '−' : '±';
  return `${fmt(a.v)} on ${formatDate(a.at)} → ${fmt(b.v)} on ${formatDate(b.at)} (${sign}${fmtChange(Math.abs(change))})`;
}

const styles = StyleSheet.create({
  root: { gap: space.md },
  start: { alignSelf: 'flex-start' },
  stack: { gap: space.lg },
  rowWide: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  chartWide: { flexBasis: 240, flexGrow: 1, minWidth: 0, gap: space.xs },
});
