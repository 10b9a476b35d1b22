import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { DataTable } from '@/components/data-table';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import type { DesignData, DesignPivot, FatigueDetail, NdtPlan } from '@/features/loads/design-schema';
import {
  q,
  categoryText,
  curveText,
  detailLoadText,
  fatigueFactorsText,
  fatigueKindLabel,
  givenOr,
  ndtIntervalText,
  ndtMethodLabel,
  pinFactorsText,
  pinSteelText,
  platesText,
  plateSteelText,
  stressFactorText,
} from '@/features/registry/design-life-format';
import type { UnitSystem } from '@/lib/units';

type TableProps = { data: DesignData; system: UnitSystem };

const pivotLabel = (data: DesignData, joint: number) =>
  `P${joint + 1} · ${data.pivots.find((p) => p.joint === joint)?.name ?? data.bodies[joint]?.name ?? '?'}`;

const byJoint = (a: { joint: number }, b: { joint: number }) => a.joint - b.joint;

/** Which pivots a list leaves out, said once under its table. */
function Missing({ pivots, data, what }: { pivots: DesignPivot[]; data: DesignData; what: string }) {
  if (pivots.length === 0) return null;
  return (
    <Text variant="small" muted>
      {`No ${what} for ${pivots.map((p) => pivotLabel(data, p.joint)).join(', ')}.`}
    </Text>
  );
}

/** Each pivot's pin and plates for the EN 1993-1-8 §3.13 (Table 3.10) checks. */
export function PinCheckTable({ data, system }: TableProps) {
  const pivots = [...data.pivots].sort(byJoint);
  const given = pivots.flatMap((p) => (p.pinCheck ? [{ p, c: p.pinCheck }] : []));
  if (given.length === 0)
    return <Text muted>No pin and plate data given: the EN 1993-1-8 pin checks are not made.</Text>;
  return (
    <View style={styles.block}>
      <DataTable
        label="Pin checks"
        rows={given}
        rowKey={({ p }) => String(p.joint)}
        columns={[
          { key: 'pivot', title: 'Pivot', render: ({ p }) => pivotLabel(data, p.joint), flex: 1.3 },
          { key: 'pin', title: 'Pin steel', render: ({ c }) => pinSteelText(c, system, true), flex: 1.7 },
          { key: 'plate', title: 'Plate steel', render: ({ c }) => plateSteelText(c, system), flex: 1.1 },
          {
            key: 'plates',
            title: 'Plates and gap',
            render: ({ p, c }) => platesText(c, p.shear, system),
            flex: 1.8,
          },
          {
            key: 'replace',
            title: 'Pin replaceable',
            render: ({ c }) => (c.replaceable ? 'Yes: serviceability checks too' : 'No'),
            flex: 0.9,
          },
          { key: 'factors', title: 'Partial factors', render: ({ c }) => pinFactorsText(c), flex: 1.8 },
        ]}
      />
      <Text variant="small" muted>
        Checked at the pivot’s peak force with its pin diameter (the measured one when an inspection gives
        it). * EN 1993-1-8’s recommended value, used because the design data gives none.
      </Text>
      <Missing pivots={pivots.filter((p) => !p.pinCheck)} data={data} what="pin check data" />
    </View>
  );
}

/** The NDT each pivot needs, from the maker's manual. */
export function NdtPlanTable({ data }: { data: DesignData }) {
  const pivots = [...data.pivots].sort(byJoint);
  const rows = pivots.flatMap((p) => (p.ndt ?? []).map((plan, k) => ({ joint: p.joint, plan, k })));
  if (rows.length === 0) return <Text muted>No NDT plans given: no NDT falls due.</Text>;
  return (
    <View style={styles.block}>
      <DataTable<{ joint: number; plan: NdtPlan; k: number }>
        label="NDT plans"
        rows={rows}
        rowKey={({ joint, k }) => `${joint}.${k}`}
        columns={[
          { key: 'pivot', title: 'Pivot', render: ({ joint }) => pivotLabel(data, joint), flex: 1.3 },
          {
            key: 'method',
            title: 'Method',
            render: ({ plan }) => `${plan.method} · ${ndtMethodLabel[plan.method]}`,
            flex: 1.4,
          },
          {
            key: 'interval',
            title: 'Interval',
            render: ({ plan }) => ndtIntervalText(plan.intervalDays),
            flex: 1.2,
          },
          { key: 'note', title: 'Where', render: ({ plan }) => plan.note ?? '—', flex: 2 },
        ]}
      />
      <Missing pivots={pivots.filter((p) => !p.ndt?.length)} data={data} what="NDT plan" />
    </View>
  );
}

/** How the ride runs and the details whose fatigue life is followed (EN 1993-1-9). */
export function FatigueSection({ data, system }: TableProps) {
  const fatigue = data.fatigue;
  if (!fatigue)
    return <Text muted>No fatigue data given: damage per ride cycle and life used are not computed.</Text>;
  const stops = fatigue.stopsPerRideCycle ?? 1;
  return (
    <View style={styles.block}>
      <Card style={styles.runCard}>
        <Line label="Ride cycle" value={`${q(fatigue.rideCycleS, 'time', system)} of the design motion`} />
        <Line
          label="Service stops per ride cycle"
          value={`${stops}${fatigue.stopsPerRideCycle === undefined ? ' (default)' : ''}`}
        />
      </Card>
      {fatigue.details.length === 0 ? (
        <Text muted>No fatigue details given.</Text>
      ) : (
        <DataTable<{ d: FatigueDetail; k: number }>
          label="Fatigue details"
          rows={fatigue.details.map((d, k) => ({ d, k }))}
          rowKey={({ k }) => String(k)}
          columns={[
            { key: 'name', title: 'Detail', render: ({ d }) => d.name, flex: 1.5 },
            { key: 'pivot', title: 'Pivot', render: ({ d }) => pivotLabel(data, d.joint), flex: 1.2 },
            { key: 'kind', title: 'Kind', render: ({ d }) => fatigueKindLabel[d.kind], flex: 0.9 },
            { key: 'load', title: 'Load followed', render: ({ d }) => detailLoadText(d, data), flex: 2 },
            {
              key: 'factor',
              title: 'Stress per load',
              render: ({ d }) => stressFactorText(d, system),
              numeric: true,
              flex: 1.6,
            },
            {
              key: 'cat',
              title: 'Category and S-N curve',
              render: ({ d }) => `${categoryText(d, system)}\n${curveText(d)}`,
              flex: 1.7,
            },
            { key: 'gamma', title: 'Partial factors', render: ({ d }) => fatigueFactorsText(d), flex: 1.1 },
            {
              key: 'limit',
              title: 'Damage limit',
              render: ({ d }) => givenOr(d.damageLimit, 1),
              numeric: true,
              flex: 0.8,
            },
          ]}
        />
      )}
      <Text variant="small" muted>
        Each detail’s stress follows one component of its pivot’s load in the frame of the member carrying it;
        ranges are counted by rainflow (ASTM E1049) and summed by Palmgren–Miner on the EN 1993-1-9 curve of
        its category. A ride cycle is its time of the design motion and its service stops. * Not given: the
        default (γFf = γMf = 1; damage limit 1, the Miner sum of EN 1993-1-9).
      </Text>
    </View>
  );
}

function Line({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.line}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <Text variant="figure">{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  block: { gap: space.sm },
  runCard: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xl },
  line: { gap: 2 },
});
