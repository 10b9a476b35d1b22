import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { DataTable } from '@/components/data-table';
import { SectionTitle } from '@/components/screen';
import { Segmented } from '@/components/segmented';
import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { type CycleResult, ENGINE_VERSION, analyseCycle } from '@/features/loads/engine';
import { formatLimit, formatRatio, formatValue } from '@/features/loads';
import { ChainDrawing, pivotPeaks } from '@/features/registry/chain-drawing';
import { designPose, peakPose } from '@/features/registry/chain-geometry';
import { type DesignData, designBodies, designToCycleInput } from '@/features/loads/design-schema';
import {
  designOriginLabel,
  gRange,
  motionKindText,
  motionLimitText,
  motionStopText,
  motionText,
  partGeometry,
  partKindLabel,
  point,
  q,
} from '@/features/registry/design-format';
import { FatigueSection, NdtPlanTable, PinCheckTable } from '@/features/registry/design-life-tables';
import type { DesignVersionInfo } from '@/features/registry/schema';
import { formatDateTime } from '@/lib/dates';
import { type UnitSystem, formatSignificant } from '@/lib/units';

type DesignAnalysis = { result: CycleResult; error: null } | { result: null; error: string };

/**
 * The engine's cycle at the design motion, run on this device (the same engine the server runs). Design
 * data that validates can still describe a motion without a cycle (every joint held), which the engine
 * refuses: that is said, not thrown.
 */
export function useDesignAnalysis(data: DesignData): DesignAnalysis {
  return useMemo(() => {
    try {
      return { result: analyseCycle(designToCycleInput(data)), error: null };
    } catch (e) {
      return { result: null, error: e instanceof Error ? e.message : 'The engine could not analyse this.' };
    }
  }, [data]);
}

type PoseChoice = 'design' | 'peak';

/** The chain drawn to scale with each pivot's peak load at the design motion, and the short caution. */
export function DesignDrawingPanel({
  data,
  system,
  analysis,
}: {
  data: DesignData;
  system: UnitSystem;
  analysis: DesignAnalysis;
}) {
  const wide = useWide();
  const [choice, setChoice] = useState<PoseChoice>('design');
  const result = analysis.result;
  const pose = useMemo(
    () => (choice === 'peak' && result ? peakPose(result, 0) : designPose(data)),
    [choice, result, data],
  );
  const peaks = useMemo(() => (result ? pivotPeaks(result) : null), [result]);
  return (
    <Card style={styles.panel}>
      <View style={styles.panelHead}>
        <View style={styles.panelTitle}>
          <Text variant="heading">Body chain, to scale</Text>
          <Text variant="small" muted>
            {choice === 'design'
              ? 'At the design pose. Beside each pivot: its peak force over one design ride cycle.'
              : 'At the instant the main pivot’s force peaks in the design ride cycle.'}
          </Text>
        </View>
        {result ? (
          <Segmented
            label="Pose shown"
            value={choice}
            onChange={setChoice}
            options={[
              { value: 'design', label: 'Design pose' },
              { value: 'peak', label: 'At peak load' },
            ]}
          />
        ) : null}
      </View>
      <ChainDrawing data={data} pose={pose} peaks={peaks} system={system} maxHeight={wide ? 440 : 340} />
      {analysis.error !== null ? (
        <Text color={colors.near}>No cycle to analyse: {analysis.error}</Text>
      ) : (
        <PivotPeaksTable result={analysis.result} data={data} system={system} />
      )}
      <Caution />
    </Card>
  );
}

/** Peak force and torque per pivot at the design motion, against the design force limit. */
function PivotPeaksTable({
  result,
  data,
  system,
}: {
  result: CycleResult;
  data: DesignData;
  system: UnitSystem;
}) {
  const pivotName = (i: number) => data.pivots.find((p) => p.joint === i)?.name ?? data.bodies[i]?.name ?? '';
  return (
    <View style={styles.peaks}>
      <DataTable
        label="Peak pivot loads at the design motion"
        rows={result.joints.map((j, i) => ({
          j,
          i,
          force: result.envelope.find((e) => e.id === `joints.${i}.force`) ?? null,
        }))}
        rowKey={({ i }) => String(i)}
        columns={[
          { key: 'pivot', title: 'Pivot', render: ({ i }) => `P${i + 1} · ${pivotName(i)}`, flex: 1.5 },
          {
            key: 'peak',
            title: 'Peak force',
            render: ({ j }) => formatValue(j.peakForce.value, 'force', system),
            numeric: true,
          },
          {
            key: 'limit',
            title: 'Force limit',
            // The column title says it is an upper limit; the value alone keeps the column narrow.
            render: ({ force }) =>
              force?.limit.kind === 'upper'
                ? formatValue(force.limit.max, 'force', system)
                : force
                  ? formatLimit(force.limit, 'force', system)
                  : '—',
            numeric: true,
          },
          {
            key: 'ratio',
            title: 'Of limit',
            render: ({ force }) => (force ? formatRatio(force.ratio) : '—'),
            numeric: true,
            flex: 0.7,
          },
          {
            key: 'status',
            title: 'Status',
            render: ({ force }) =>
              force ? <EnvelopeMark status={force.status} compact /> : 'No limit given',
            flex: 1.1,
          },
          {
            key: 'torque',
            title: 'Peak torque',
            render: ({ j }) => formatValue(Math.abs(j.peakTorque.value), 'moment', system),
            numeric: true,
            flex: 1.15,
          },
        ]}
      />
      <Text variant="small" muted>
        Computed on this device by load engine {ENGINE_VERSION} over one design ride cycle (
        {formatValue(result.durationS, 'time', system)}, {result.samples} instants).
      </Text>
    </View>
  );
}

/** Which version this is: its source document, who made it, when and why. */
export function DesignVersionCard({
  version,
  data,
  note,
  footer,
}: {
  version: DesignVersionInfo;
  data: DesignData;
  note?: React.ReactNode;
  footer?: React.ReactNode;
}) {
  return (
    <Card accessibilityLabel={`Design data version ${version.version}`}>
      <View style={styles.versionHead}>
        <Text variant="heading">Design data v{version.version}</Text>
        <Text variant="small" muted>
          {designOriginLabel[version.origin]}
        </Text>
      </View>
      {note}
      <Field label="Source document" value={`${data.source.document}, revision ${data.source.revision}`} />
      <Field label="Made by" value={`${version.createdByName}, ${formatDateTime(version.createdAt)}`} />
      <Field label="Why" value={version.reason} />
      {footer}
    </Card>
  );
}

export function Field({ label, value, figure }: { label: string; value: string; figure?: boolean }) {
  return (
    <View style={styles.field}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <Text variant={figure ? 'figure' : 'body'}>{value}</Text>
    </View>
  );
}

/**
 * Every table of the design data: bodies, parts, pivots and pins, pin checks, NDT plans, seats, design
 * motion, rider limits and fatigue.
 */
export function DesignTables({ data, system }: { data: DesignData; system: UnitSystem }) {
  return (
    <View style={styles.tables}>
      <SectionTitle>Bodies (combined from their parts)</SectionTitle>
      <BodiesTable data={data} system={system} />

      <SectionTitle>{`Parts (${data.parts.length})`}</SectionTitle>
      <PartsTable data={data} system={system} />

      <SectionTitle>Pivots and pins</SectionTitle>
      <PivotsTable data={data} system={system} />

      <SectionTitle>Pin checks (EN 1993-1-8 §3.13)</SectionTitle>
      <PinCheckTable data={data} system={system} />

      <SectionTitle>NDT plans</SectionTitle>
      <NdtPlanTable data={data} />

      <SectionTitle>{`Seats (${data.seats.length})`}</SectionTitle>
      <SeatsTable data={data} system={system} />

      <SectionTitle>Design motion and limits</SectionTitle>
      <MotionTable data={data} system={system} />

      <SectionTitle>Rider limits</SectionTitle>
      <RiderLimits data={data} />

      <SectionTitle>Fatigue (EN 1993-1-9)</SectionTitle>
      <FatigueSection data={data} system={system} />
    </View>
  );
}

type TableProps = { data: DesignData; system: UnitSystem };

/** "2 · Gondola": a body as the tables name it. */
const bodyName = (data: DesignData, i: number) => `${i + 1} · ${data.bodies[i]?.name ?? '?'}`;

function BodiesTable({ data, system }: TableProps) {
  const bodies = useMemo(() => designBodies(data), [data]);
  return (
    <DataTable
      label="Bodies"
      rows={bodies.map((b, i) => ({ b, i }))}
      rowKey={({ i }) => String(i)}
      columns={[
        { key: 'body', title: 'Body', render: ({ i }) => bodyName(data, i), flex: 1.4 },
        { key: 'mass', title: 'Mass', render: ({ b }) => q(b.massKg, 'mass', system), numeric: true },
        {
          key: 'cg',
          title: 'CG in body frame',
          render: ({ b }) => point(b.cgM, system),
          numeric: true,
          flex: 1.3,
        },
        {
          key: 'inertia',
          title: 'Inertia about CG',
          render: ({ b }) => `${formatSignificant(b.inertiaCgKgM2, 4)} kg·m²`,
          numeric: true,
        },
        {
          key: 'tip',
          title: 'Next pivot at',
          render: ({ i }) => {
            const tip = i < data.bodies.length - 1 ? data.bodies[i].tipM : undefined;
            return tip ? point(tip, system) : '—';
          },
          numeric: true,
        },
      ]}
    />
  );
}

function PartsTable({ data, system }: TableProps) {
  return (
    <DataTable
      label="Parts"
      rows={data.parts.map((p, k) => ({ p, k }))}
      rowKey={({ k }) => String(k)}
      columns={[
        { key: 'name', title: 'Part', render: ({ p }) => p.name, flex: 1.5 },
        { key: 'body', title: 'Body', render: ({ p }) => bodyName(data, p.body), flex: 1.1 },
        { key: 'kind', title: 'Kind', render: ({ p }) => partKindLabel[p.kind] },
        {
          key: 'mass',
          title: 'Mass',
          render: ({ p }) => q(p.massKg, 'mass', system),
          numeric: true,
          flex: 0.8,
        },
        { key: 'where', title: 'Position and size', render: ({ p }) => partGeometry(p, system), flex: 2.4 },
      ]}
    />
  );
}

function PivotsTable({ data, system }: TableProps) {
  return (
    <DataTable
      label="Pivots"
      rows={[...data.pivots].sort((a, b) => a.joint - b.joint)}
      rowKey={(p) => String(p.joint)}
      columns={[
        { key: 'name', title: 'Pivot', render: (p) => `P${p.joint + 1} · ${p.name}`, flex: 1.6 },
        {
          key: 'pin',
          title: 'Pin Ø nominal / min',
          render: (p) =>
            `${q(p.nominalDiameterM, 'lengthSmall', system)} / ${q(p.minimumDiameterM, 'lengthSmall', system)}`,
          numeric: true,
          flex: 1.4,
        },
        {
          key: 'clear',
          title: 'Clearance limit',
          render: (p) => q(p.maxClearanceM, 'lengthSmall', system),
          numeric: true,
        },
        {
          key: 'shear',
          title: 'Shear planes',
          render: (p) => (p.shear === 'double' ? 'Double' : 'Single'),
          flex: 0.8,
        },
        {
          key: 'bearing',
          title: 'Bearing length',
          render: (p) => q(p.bearingLengthM, 'lengthSmall', system),
          numeric: true,
        },
        {
          key: 'allow',
          title: 'Allowable shear / bearing',
          render: (p) =>
            `${q(p.maxShearStressPa, 'stress', system)} / ${q(p.maxBearingPressurePa, 'stress', system)}`,
          numeric: true,
          flex: 1.5,
        },
        { key: 'force', title: 'Max force', render: (p) => q(p.maxForceN, 'force', system), numeric: true },
        {
          key: 'torque',
          title: 'Max torque',
          render: (p) => q(p.maxTorqueNm, 'moment', system),
          numeric: true,
        },
      ]}
    />
  );
}

function SeatsTable({ data, system }: TableProps) {
  return data.seats.length === 0 ? (
    <Text muted>No seats given: rider accelerations are not checked.</Text>
  ) : (
    <DataTable
      label="Seats"
      rows={data.seats.map((s, k) => ({ s, k }))}
      rowKey={({ k }) => String(k)}
      columns={[
        { key: 'name', title: 'Seat', render: ({ s }) => s.name, flex: 1.6 },
        { key: 'body', title: 'Body', render: ({ s }) => bodyName(data, s.body) },
        {
          key: 'at',
          title: 'Position',
          render: ({ s }) => point(s.positionM, system),
          numeric: true,
          flex: 1.2,
        },
        {
          key: 'spine',
          title: 'Spine direction',
          render: ({ s }) => q(s.spineAngleRad, 'angle', system),
          numeric: true,
        },
        {
          key: 'facing',
          title: 'Chest faces',
          // The chest lies 90° from the spine: clockwise by default, counter-clockwise when mirrored.
          render: ({ s }) => (s.facing === 'ccw' ? 'Spine + 90° (mirrored)' : 'Spine − 90°'),
        },
      ]}
    />
  );
}

function MotionTable({ data, system }: TableProps) {
  return (
    <DataTable
      label="Design motion"
      rows={[...data.motion].sort((a, b) => a.joint - b.joint)}
      rowKey={(m) => String(m.joint)}
      columns={[
        {
          key: 'joint',
          title: 'Joint',
          render: (m) => `P${m.joint + 1} · ${data.bodies[m.joint]?.name ?? '?'}`,
          flex: 1.4,
        },
        { key: 'kind', title: 'Motion', render: (m) => motionKindText(m) },
        {
          key: 'value',
          title: 'Design value',
          render: (m) => motionText(m, system),
          numeric: true,
          flex: 1.3,
        },
        {
          key: 'limits',
          title: 'Motion limits',
          render: (m) => motionLimitText(m, system),
          numeric: true,
          flex: 1.6,
        },
        {
          key: 'stops',
          title: 'Stop decelerations',
          render: (m) => motionStopText(m, system),
          numeric: true,
          flex: 1.6,
        },
      ]}
    />
  );
}

function RiderLimits({ data }: { data: DesignData }) {
  return (
    <Card style={styles.riderCard}>
      <Field label="Gz (along the spine)" value={gRange(data.rider.gz)} figure />
      <Field label="Gx (chest to back)" value={gRange(data.rider.gx)} figure />
      <Field
        label="Near-limit margin"
        value={
          data.nearMargin !== undefined
            ? `${Math.round(data.nearMargin * 100)} % of a limit`
            : 'Engine default'
        }
        figure
      />
      {data.gravityMS2 !== undefined ? (
        <Field label="Gravity" value={`${data.gravityMS2} m/s²`} figure />
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  panel: { gap: space.md },
  panelHead: { flexDirection: 'row', flexWrap: 'wrap', justifyContent: 'space-between', gap: space.md },
  panelTitle: { flexShrink: 1, flexBasis: 280, flexGrow: 1, gap: 2 },
  peaks: { gap: space.xs },
  versionHead: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    justifyContent: 'space-between',
    alignItems: 'baseline',
    gap: space.sm,
  },
  field: { gap: 2 },
  tables: { gap: space.md },
  riderCard: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xl },
});
