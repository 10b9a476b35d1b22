import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { Segmented } from '@/components/segmented';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import {
  type MotionKind,
  type MotionRow,
  motionKindLabel,
  motionKinds,
} from '@/features/calculator/calculator-model';
import { MeasuredRecordInput } from '@/features/calculator/measured-record-input';
import type { UnitSystem } from '@/lib/units';

/** Every joint's motion, in chain order, each with its stops. */
export function MotionCard({
  motion,
  jointNames,
  system,
  onChange,
}: {
  motion: MotionRow[];
  jointNames: string[];
  system: UnitSystem;
  onChange: (rows: MotionRow[]) => void;
}) {
  return (
    <Card>
      <Text variant="heading">Motion of each joint</Text>
      <Text variant="small" muted>
        Relative to the body before it. Start from the design values, type what you measured, or give a
        measured record.
      </Text>
      {motion.map((row, i) => (
        <MotionEditor
          key={i}
          title={`Joint ${i + 1} · ${jointNames[i] ?? ''}`}
          row={row}
          system={system}
          onChange={(r) => onChange(motion.map((m, k) => (k === i ? r : m)))}
        />
      ))}
    </Card>
  );
}

function MotionEditor({
  title,
  row,
  system,
  onChange,
}: {
  title: string;
  row: MotionRow;
  system: UnitSystem;
  onChange: (r: MotionRow) => void;
}) {
  const set = (patch: Partial<MotionRow>) => onChange({ ...row, ...patch });
  return (
    <View style={styles.motion}>
      <Text variant="label" muted>
        {title.toUpperCase()}
      </Text>
      <Segmented<MotionKind>
        label={`${title} motion`}
        value={row.kind}
        onChange={(kind) => set({ kind })}
        options={motionKinds.map((k) => ({ value: k, label: motionKindLabel[k] }))}
      />
      <View style={styles.fieldRow}>
        {row.kind === 'constant' || row.kind === 'ramp' ? (
          <NumberField label="Speed" unit="rpm" value={row.rpm} onChange={(rpm) => set({ rpm })} />
        ) : null}
        {row.kind === 'ramp' ? (
          <NumberField label="Ramp time" unit="s" value={row.rampS} onChange={(rampS) => set({ rampS })} />
        ) : null}
        {row.kind === 'swing' ? (
          <>
            <NumberField
              label="Amplitude"
              unit="°"
              value={row.amplitudeDeg}
              onChange={(amplitudeDeg) => set({ amplitudeDeg })}
            />
            <NumberField
              label="Period"
              unit="s"
              value={row.periodS}
              onChange={(periodS) => set({ periodS })}
            />
          </>
        ) : null}
        {row.kind === 'fixed' ? (
          <NumberField
            label="Angle"
            unit="°"
            value={row.angleDeg}
            onChange={(angleDeg) => set({ angleDeg })}
          />
        ) : null}
        {row.kind === 'free' ? (
          <>
            <NumberField
              label="Start angle"
              unit="°"
              value={row.angleDeg}
              onChange={(angleDeg) => set({ angleDeg })}
            />
            <NumberField
              label="Start rate"
              unit="°/s"
              value={row.startRateDegS}
              onChange={(startRateDegS) => set({ startRateDegS })}
              hint="Empty: let go from rest"
            />
          </>
        ) : null}
      </View>
      {row.kind === 'free' ? (
        <Text variant="small" muted>
          A free pin: nothing drives it, so it swings as gravity and the other joints move it. The result
          gives the period it swings at.
        </Text>
      ) : null}
      {row.kind === 'measured' ? (
        <MeasuredRecordInput title={title} row={row} system={system} onChange={set} />
      ) : null}
      {row.kind !== 'fixed' ? <StopFields row={row} onChange={set} /> : null}
    </View>
  );
}

/** The joint's stops: each is run as a ramp to rest from full speed besides the ride cycle. */
function StopFields({ row, onChange }: { row: MotionRow; onChange: (patch: Partial<MotionRow>) => void }) {
  return (
    <View style={styles.stops}>
      <Text variant="small" muted>
        Stops (optional): the deceleration from full speed. Each is checked besides the ride cycle.
      </Text>
      <View style={styles.fieldRow}>
        <NumberField
          label="Service stop"
          unit="rad/s²"
          value={row.serviceStop}
          onChange={(serviceStop) => onChange({ serviceStop })}
        />
        <NumberField
          label="Emergency stop"
          unit="rad/s²"
          value={row.emergencyStop}
          onChange={(emergencyStop) => onChange({ emergencyStop })}
        />
      </View>
    </View>
  );
}

export function NumberField({
  label,
  unit,
  value,
  onChange,
  hint,
}: {
  label: string;
  unit: string;
  value: string;
  onChange: (v: string) => void;
  hint?: string;
}) {
  return (
    <View style={styles.numberField}>
      <TextField
        label={label}
        unit={unit}
        value={value}
        onChangeText={onChange}
        inputMode="decimal"
        keyboardType="numbers-and-punctuation"
        hint={hint}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  motion: { gap: space.sm, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  fieldRow: { flexDirection: 'row', gap: space.md, flexWrap: 'wrap' },
  numberField: { flexGrow: 1, flexBasis: 140 },
  stops: { gap: space.xs, paddingTop: space.xs },
});
