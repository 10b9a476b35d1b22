import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { type ChartBand, type ChartSeries, LineChart } from '@/components/line-chart';
import { Segmented } from '@/components/segmented';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { ApiRequestError } from '@/lib/api-errors';
import { STANDARD_GRAVITY_MS2 } from '@/features/loads/engine';
import { formatBesideLimit, formatValue } from '@/features/loads';
import type { CycleResolution } from '@/features/loads/cycle-resolution-schema';
import { useInspectionCycle } from '@/features/review/inspection-api';
import type { InspectionCycle } from '@/features/review/inspection-schema';
import { pivotName } from '@/features/review/review-format';
import { type UnitSystem, fromSI, pickDisplayUnit, toSI } from '@/lib/units';
import { formatAgainstLimit, formatStated } from '@/lib/measured-format';

type CycleAxis = 'angle' | 'time';

const seatColours = [colors.base, colors.accent, colors.focus, colors.within, colors.near];

/**
 * The inspection's ride cycle over time or over the main arm's angle: the force on each pivot with its
 * limit line, and what riders feel on each seat axis with the allowed band. The server recomputes the
 * cycle from the record; without design data there is none, and the screen says so.
 */
export function CycleCharts({
  inspectionId,
  pivots,
  system,
}: {
  inspectionId: string;
  pivots: readonly string[];
  system: UnitSystem;
}) {
  const [resolution, setResolution] = useState<CycleResolution>('bounded');
  const cycle = useInspectionCycle(inspectionId, true, resolution);
  const [axis, setAxis] = useState<CycleAxis>('angle');
  if (cycle.isPending) {
    return (
      <Card style={styles.center}>
        <Spinner color={colors.base} />
      </Card>
    );
  }
  if (cycle.error instanceof ApiRequestError && cycle.error.status === 404) {
    return (
      <Card role="note">
        <Text variant="heading">No ride cycle to chart</Text>
        <Text muted>
          The server has no design data for this inspection, so it cannot run the load engine over a ride
          cycle. Enter the ride’s design data and amend the inspection to have it checked.
        </Text>
      </Card>
    );
  }
  if (cycle.error instanceof ApiRequestError && cycle.error.status === 422) {
    // The engine refused these readings on this design data; its reason is the useful part.
    return (
      <Card role="note">
        <Text variant="heading">No ride cycle to chart</Text>
        <Text muted>{cycle.error.message}</Text>
      </Card>
    );
  }
  if (resolution === 'full' && cycle.error instanceof ApiRequestError && cycle.error.status === 400) {
    // More samples than the server sends whole: its reason, and the way back to the bounded series.
    return (
      <Card role="note">
        <Text variant="heading">Every instant is more than the server sends</Text>
        <Text muted>{cycle.error.issues[0]?.message ?? cycle.error.message}</Text>
        <Button
          label="Show the bounded series"
          tone="quiet"
          onPress={() => setResolution('bounded')}
          style={styles.retry}
        />
      </Card>
    );
  }
  if (cycle.error || !cycle.data) {
    return (
      <Card role="alert">
        <Text>The ride cycle could not be loaded.</Text>
        <Button label="Try again" tone="quiet" onPress={() => cycle.refetch()} style={styles.retry} />
      </Card>
    );
  }
  return (
    <Charts
      cycle={cycle.data}
      axis={axis}
      onAxis={setAxis}
      onFull={() => setResolution('full')}
      pivots={pivots}
      system={system}
    />
  );
}

function Charts({
  cycle,
  axis,
  onAxis,
  onFull,
  pivots,
  system,
}: {
  cycle: InspectionCycle;
  axis: CycleAxis;
  onAxis: (a: CycleAxis) => void;
  onFull: () => void;
  pivots: readonly string[];
  system: UnitSystem;
}) {
  const wide = useWide();
  const x = xValues(cycle, axis);
  const names = cycle.joints.map((j, i) => pivots[i] ?? j.name);
  return (
    <View style={styles.root}>
      <View style={styles.toolbar}>
        <Text variant="small" muted style={styles.toolbarText}>
          {cycle.samples} instants over {formatValue(cycle.durationS, 'time', system)} · engine{' '}
          {cycle.engineVersion}
          {cycle.sampleIndex
            ? ` · drawn through ${cycle.sampleIndex.length} of them, every peak and trough kept`
            : null}
        </Text>
        {cycle.sampleIndex ? (
          <Button label="Every instant" tone="quiet" onPress={onFull} style={styles.retry} />
        ) : null}
        <Segmented
          label="Chart against"
          value={axis}
          onChange={onAxis}
          options={[
            { value: 'angle', label: 'Arm angle' },
            { value: 'time', label: 'Time' },
          ]}
        />
      </View>
      <View style={wide ? styles.gridWide : styles.grid}>
        {cycle.joints.map((j, i) => {
          const limit = cycle.envelope.find((e) => e.id === `joints.${i}.force`);
          const max = limit?.limit.kind === 'upper' ? limit.limit.max : null;
          const unit = pickDisplayUnit(Math.max(j.peakForce.value, max ?? 0), 'force', system);
          const toUnit = (v: number) => fromSI(v, 'force', unit.mathjs);
          const name = pivotName(i, names);
          const beside = formatBesideLimit(
            j.peakForce.value,
            max !== null ? { side: 'max', si: max } : null,
            'force',
            system,
            false,
          );
          const peakAt =
            axis === 'time'
              ? `at ${formatValue(j.peakForce.timeS, 'time', system)}`
              : `at arm angle ${formatValue(x.arm(j.peakForce.armAngleRad), 'angle', system)}`;
          return (
            <Card key={i} style={wide ? styles.chartWide : undefined}>
              <Text variant="heading">Force on {name}</Text>
              <LineChart
                summary={
                  `Force on ${name} over the ride cycle against ${axis === 'time' ? 'time' : 'the main arm angle'}; ` +
                  `peak ${beside.value} ${peakAt}` +
                  (beside.limit !== null ? `; limit ${beside.limit}` : '; no force limit given')
                }
                series={[
                  {
                    label: 'Force magnitude',
                    ...withGaps(x, j.forceMagnitudeN.map(toUnit)),
                    color: colors.base,
                  },
                ]}
                limits={max !== null ? [{ label: `Limit ${beside.limit}`, y: toUnit(max) }] : []}
                xLabel={x.label}
                yLabel={`Force (${unit.label})`}
                xDomain={x.domain}
                xTicks={x.ticks}
              />
              {max === null ? (
                <Text variant="small" muted>
                  The design data gives no force limit for this pivot.
                </Text>
              ) : null}
            </Card>
          );
        })}
        {cycle.seats.length > 0
          ? (['gz', 'gx'] as const).map((ax) => (
              <RiderChart key={ax} cycle={cycle} axis={ax} x={x} wide={wide} />
            ))
          : null}
      </View>
      <Caution />
    </View>
  );
}

function RiderChart({
  cycle,
  axis,
  x,
  wide,
}: {
  cycle: InspectionCycle;
  axis: 'gx' | 'gz';
  x: XAxis;
  wide: boolean;
}) {
  // Rider limits apply to every seat; the engine writes them per seat in m/s².
  const item = cycle.envelope.find((e) => e.id.startsWith('seats.') && e.id.endsWith(`.${axis}`));
  const toG = (v: number | undefined) => (v === undefined ? undefined : v / STANDARD_GRAVITY_MS2);
  const min = item?.limit.kind === 'range' ? toG(item.limit.min) : undefined;
  const max = item?.limit.kind === 'range' ? toG(item.limit.max) : undefined;
  // Extremes are shown against the rider limit, so an extreme just past it never reads as on it.
  const againstG = (g: number) =>
    item ? formatAgainstLimit(toSI(g, 'accel', 'gee'), item.limit, 'accel', 'si').value : fmtG(g);
  const band: ChartBand | undefined =
    min !== undefined || max !== undefined
      ? {
          min: min !== undefined ? { label: `Min ${statedG(min)}`, y: min } : undefined,
          max: max !== undefined ? { label: `Max ${statedG(max)}`, y: max } : undefined,
        }
      : undefined;
  const series: ChartSeries[] = cycle.seats.map((s, k) => ({
    label: s.name,
    ...withGaps(x, s[axis]),
    color: seatColours[k % seatColours.length],
    dashed: k >= seatColours.length,
  }));
  const title = axis === 'gz' ? 'Rider Gz (spine, seat to head)' : 'Rider Gx (chest to back)';
  const extremes = cycle.seats
    .map((s) => `${s.name} ${againstG(s.extremes[axis].min)} to ${againstG(s.extremes[axis].max)}`)
    .join('; ');
  return (
    <Card style={wide ? styles.chartWide : undefined}>
      <Text variant="heading">{title}</Text>
      <LineChart
        summary={`${title} over the ride cycle: ${extremes}${
          band
            ? `; allowed ${min !== undefined ? statedG(min) : 'no minimum'} to ${max !== undefined ? statedG(max) : 'no maximum'}`
            : '; no rider limit given'
        }`}
        series={series}
        band={band}
        xLabel={x.label}
        yLabel="Acceleration (g)"
        xDomain={x.domain}
        xTicks={x.ticks}
      />
      <Text variant="small" muted>
        {band
          ? 'The tinted band is the design’s allowed range. Gravity included; not low-pass filtered.'
          : 'The design data gives no rider limit for this axis. Gravity included; not low-pass filtered.'}
      </Text>
    </Card>
  );
}

// Rider accelerations (in g here) and their limits by the one rule for computed and stated values.
const fmtG = (v: number) => formatValue(toSI(v, 'accel', 'gee'), 'accel', 'si');
const statedG = (v: number) => formatStated(toSI(v, 'accel', 'gee'), 'accel', 'si').text;

type XAxis = {
  values: number[];
  /** Indices where the line must not join the previous sample (an angle wrapping round). */
  breaks: Set<number>;
  label: string;
  domain?: [number, number];
  ticks?: number[];
  /** The main arm angle shown for a raw angle (wrapped for a turning arm, as is for a swinging one). */
  arm: (rad: number) => number;
};

/**
 * Time, or the main arm's angle. A turning arm is shown from 0° to 360°, with the line broken where it
 * comes round again; a swinging arm keeps its signed angle, its outward and return strokes both drawn.
 */
function xValues(cycle: InspectionCycle, axis: CycleAxis): XAxis {
  if (axis === 'time' || cycle.joints.length === 0)
    return { values: cycle.timeS, breaks: new Set(), label: 'Time (s)', arm: (r) => r };
  const arm = cycle.joints[0].angleRad;
  const finite = arm.filter((v) => Number.isFinite(v));
  const travel = Math.max(...finite) - Math.min(...finite);
  const toDeg = (r: number) => (r * 180) / Math.PI;
  if (travel < 2 * Math.PI - 1e-9) {
    return { values: arm.map(toDeg), breaks: new Set(), label: 'Main arm angle (°)', arm: (r) => r };
  }
  const wrap = (r: number) => ((r % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
  const values = arm.map((r) => toDeg(wrap(r)));
  const breaks = new Set<number>();
  values.forEach((v, k) => {
    if (k > 0 && Math.abs(v - values[k - 1]) > 180) breaks.add(k);
  });
  return {
    values,
    breaks,
    label: 'Main arm angle (°)',
    domain: [0, 360],
    ticks: [0, 90, 180, 270, 360],
    arm: wrap,
  };
}

/** A gap at each break, so the line lifts there instead of crossing the chart. */
function withGaps(axis: XAxis, y: readonly number[]): { x: number[]; y: (number | null)[] } {
  const xs: number[] = [];
  const ys: (number | null)[] = [];
  axis.values.forEach((v, k) => {
    if (axis.breaks.has(k)) {
      xs.push(Number.NaN);
      ys.push(null);
    }
    xs.push(v);
    ys.push(y[k] ?? null);
  });
  return { x: xs, y: ys };
}

const styles = StyleSheet.create({
  root: { gap: space.md },
  center: { alignItems: 'center' },
  retry: { alignSelf: 'flex-start' },
  toolbar: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
  },
  toolbarText: { flexShrink: 1 },
  grid: { gap: space.md },
  gridWide: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  chartWide: { flexBasis: 320, flexGrow: 1, minWidth: 0 },
});
