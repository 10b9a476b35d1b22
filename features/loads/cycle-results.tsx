import { useMemo } from 'react';
import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { DataTable } from '@/components/data-table';
import { LineChart } from '@/components/line-chart';
import { SectionTitle } from '@/components/screen';
import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import {
  BOUNDED_CYCLE_VALUES,
  type CycleResult,
  ENGINE_ASSUMPTIONS,
  ENGINE_VERSION,
  boundCycle,
} from '@/features/loads/engine';
import { CycleWarnings } from '@/features/loads/cycle-warnings';
import { EnvelopeTable } from '@/features/loads/envelope-table';
import { formatValue } from '@/features/loads/format';
import {
  FORCE_RANGE_TITLE,
  RANGES_NOTE,
  TORQUE_RANGE_TITLE,
  forceRangeText,
  jointRangesOf,
  torqueRangeText,
} from '@/features/loads/joint-ranges';
import { type CasesShown, LoadCasesTable } from '@/features/loads/load-cases-table';
import { type UnitSystem, fromSI, pickDisplayUnit, toSI } from '@/lib/units';
import type { MeasuredSource } from '@/lib/measured-format';

const statusHeadline = {
  within: 'Every checked value is within the design envelope.',
  near: 'Some values are near their limits. Look at them before you sign off.',
  over: 'Values are over their limits. Follow your stop and lockout procedure and escalate.',
} as const;

/** The whole result of a load check: headline status, pivot peaks, charts, rider accelerations, envelope. */
export function CycleResults({
  result,
  system,
  xAxis,
  sources,
  cases,
}: {
  result: CycleResult;
  system: UnitSystem;
  xAxis: 'angle' | 'time';
  /** How measured values were typed, by envelope id (`measuredSources`), so they read as typed. */
  sources?: ReadonlyMap<string, MeasuredSource>;
  /** The stops run besides the ride cycle (features/loads/load-cases.ts), when any were. */
  cases?: CasesShown | null;
}) {
  const wide = useWide();
  // The charts draw a bounded set of instants (every peak kept): a 10,000-sample record is no heavier to
  // draw than the 360 of a cycle that fits whole, and that one is drawn as it is.
  const drawn = useMemo(() => boundCycle(result, BOUNDED_CYCLE_VALUES).result, [result]);
  const hasEnvelope = result.envelope.length > 0;
  const freeSwings = result.joints.flatMap((j, i) =>
    j.freePeriodS === undefined ? [] : [{ i, name: j.name, periodS: j.freePeriodS }],
  );
  return (
    <View style={styles.root}>
      <Card style={styles.headline}>
        {hasEnvelope ? <EnvelopeMark status={result.status} /> : null}
        <Text variant="heading">
          {hasEnvelope
            ? statusHeadline[result.status]
            : 'No design limits were given: loads only, no statuses.'}
        </Text>
        <Text variant="small" muted>
          {result.samples} instants over {formatValue(result.durationS, 'time', system)} · engine{' '}
          {ENGINE_VERSION}
        </Text>
        {freeSwings.map((f) => (
          <Text key={f.i}>
            Pivot {f.i + 1} · {f.name} swings freely:{' '}
            {f.periodS === null
              ? 'no period found within the cycle'
              : `period ${formatValue(f.periodS, 'time', system)}`}
          </Text>
        ))}
      </Card>

      <CycleWarnings
        warnings={result.warnings}
        jointNames={result.joints.map((j) => j.name)}
        seatNames={result.seats.map((s) => s.name)}
      />

      <SectionTitle>Pivot loads over the cycle</SectionTitle>
      <PivotLoadsTable result={result} system={system} xAxis={xAxis} />
      <Text variant="small" muted>
        {RANGES_NOTE}
      </Text>

      {cases && cases.cases.length > 1 ? (
        <>
          <SectionTitle>Ride cycle and stops</SectionTitle>
          <LoadCasesTable
            cases={cases.cases}
            governing={cases.governing}
            envelope={cases.envelope ?? result.envelope}
            system={system}
          />
        </>
      ) : null}

      <View style={wide ? styles.chartsWide : styles.charts}>
        {result.joints.map((_, i) => (
          <PivotForceChart key={i} result={drawn} joint={i} system={system} xAxis={xAxis} wide={wide} />
        ))}
      </View>

      {result.seats.length > 0 ? <RiderAccelerations result={result} /> : null}

      {hasEnvelope ? (
        <>
          <SectionTitle>Against the design envelope</SectionTitle>
          <EnvelopeTable items={result.envelope} system={system} sources={sources} />
        </>
      ) : null}

      <SectionTitle>Assumptions</SectionTitle>
      <View style={styles.assumptions}>
        {ENGINE_ASSUMPTIONS.map((a) => (
          <Text key={a} variant="small" muted>
            • {a}
          </Text>
        ))}
      </View>
      <Caution />
    </View>
  );
}

type Props = { result: CycleResult; system: UnitSystem; xAxis: 'angle' | 'time' };

function PivotLoadsTable({ result, system, xAxis }: Props) {
  return (
    <DataTable
      label="Pivot loads"
      rows={result.joints.map((j, i) => ({ j, i }))}
      rowKey={({ i }) => String(i)}
      columns={[
        { key: 'pivot', title: 'Pivot', render: ({ j, i }) => `${i + 1} · ${j.name}`, flex: 1.4 },
        {
          key: 'peak',
          title: 'Peak force',
          render: ({ j }) => formatValue(j.peakForce.value, 'force', system),
          numeric: true,
        },
        {
          key: 'where',
          title: xAxis === 'angle' ? 'At arm angle' : 'At time',
          render: ({ j }) =>
            xAxis === 'angle'
              ? formatValue(wrapAngle(j.peakForce.armAngleRad), 'angle', system)
              : formatValue(j.peakForce.timeS, 'time', system),
          numeric: true,
        },
        {
          key: 'range',
          title: FORCE_RANGE_TITLE,
          render: ({ j }) => forceRangeText(jointRangesOf(j), system),
          numeric: true,
          flex: 1.8,
        },
        {
          key: 'torque',
          title: 'Peak torque',
          // A free pin carries no torque; the integrator's round-off is not a value to read.
          render: ({ j }) =>
            j.freePeriodS !== undefined
              ? 'None: free pin'
              : formatValue(Math.abs(j.peakTorque.value), 'moment', system),
          numeric: true,
        },
        {
          key: 'torqueRange',
          title: TORQUE_RANGE_TITLE,
          render: ({ j }) =>
            j.freePeriodS !== undefined ? 'None: free pin' : torqueRangeText(jointRangesOf(j), system),
          numeric: true,
        },
      ]}
    />
  );
}

/** One pivot's force over the cycle, with its limit when the design gives one. */
function PivotForceChart({
  result,
  joint: i,
  system,
  xAxis,
  wide,
}: Props & { joint: number; wide: boolean }) {
  const j = result.joints[i];
  const limit = result.envelope.find((e) => e.id === `joints.${i}.force`);
  const unit = pickDisplayUnit(j.peakForce.value, 'force', system);
  const toUnit = (v: number) => fromSI(v, 'force', unit.mathjs);
  const { x, y } = chartPoints(result, i, xAxis, toUnit);
  return (
    <Card style={wide ? styles.chartCardWide : undefined}>
      <Text variant="heading">
        Pivot {i + 1} · {j.name}
      </Text>
      <LineChart
        height={240}
        summary={`Force on pivot ${i + 1} over the cycle; peak ${formatValue(j.peakForce.value, 'force', system)}`}
        series={[{ label: 'Force magnitude', x, y, color: colors.base }]}
        limits={
          limit && limit.limit.kind === 'upper'
            ? [
                {
                  label: `Limit ${formatValue(limit.limit.max, 'force', system)}`,
                  y: toUnit(limit.limit.max),
                },
              ]
            : []
        }
        xLabel={xAxis === 'angle' ? 'Main arm angle (°)' : 'Time (s)'}
        yLabel={`Force (${unit.label})`}
        xDomain={xAxis === 'angle' ? [0, 360] : undefined}
        xTicks={xAxis === 'angle' ? [0, 90, 180, 270, 360] : undefined}
      />
    </Card>
  );
}

function RiderAccelerations({ result }: { result: CycleResult }) {
  return (
    <>
      <SectionTitle>What riders feel (g, gravity included)</SectionTitle>
      <DataTable
        label="Rider accelerations"
        rows={result.seats}
        rowKey={(s) => s.name}
        columns={[
          { key: 'seat', title: 'Seat', render: (s) => s.name, flex: 1.4 },
          { key: 'gzmin', title: 'Gz min', render: (s) => fmtG(s.extremes.gz.min), numeric: true },
          { key: 'gzmax', title: 'Gz max', render: (s) => fmtG(s.extremes.gz.max), numeric: true },
          { key: 'gxmin', title: 'Gx min', render: (s) => fmtG(s.extremes.gx.min), numeric: true },
          { key: 'gxmax', title: 'Gx max', render: (s) => fmtG(s.extremes.gx.max), numeric: true },
        ]}
      />
      <Text variant="small" muted>
        Gz runs along the spine (positive pushes the rider into the seat, “eyes down”); Gx runs chest to back.
        Not low-pass filtered: compare with limits as your standard requires.
      </Text>
    </>
  );
}

// Seat histories are in g; shown by the one rule for computed values, like every other result.
const fmtG = (v: number) => formatValue(toSI(v, 'accel', 'gee'), 'accel', 'si');

function wrapAngle(rad: number): number {
  const full = 2 * Math.PI;
  return ((rad % full) + full) % full;
}

/** x (deg or s) and y (display unit) for one joint; angle plots are sorted so the line reads left to right. */
function chartPoints(
  result: CycleResult,
  joint: number,
  xAxis: 'angle' | 'time',
  toUnit: (v: number) => number,
) {
  const mag = result.joints[joint].forceMagnitudeN;
  const n = mag.length;
  if (xAxis === 'time') return { x: Array.from(result.timeS), y: Array.from(mag, toUnit) };
  const arm = result.joints[0].angleRad;
  const pts = Array.from({ length: n }, (_, k) => [(wrapAngle(arm[k]) * 180) / Math.PI, toUnit(mag[k])]);
  pts.sort((a, b) => a[0] - b[0]);
  return { x: pts.map((p) => p[0]), y: pts.map((p) => p[1]) };
}

const styles = StyleSheet.create({
  root: { gap: space.lg },
  headline: { gap: space.sm },
  charts: { gap: space.md },
  chartsWide: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  chartCardWide: { flexBasis: 460, flexGrow: 1 },
  assumptions: { gap: 2 },
});
