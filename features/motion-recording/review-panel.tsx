import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Caution } from '@/components/caution';
import { ChoiceChips } from '@/components/choice-chips';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import type { DesignData } from '@/features/loads/design-schema';
import { chooseAxis, trimToCycles, type SensorTrace } from '@/features/motion-recording/processing';
import { RateTrace } from '@/features/motion-recording/rate-trace';
import { MeasuredRiderTable } from '@/features/motion-recording/measured-rider';
import { measuredRiderOf } from '@/features/records';
import type { MotionRecord, PhoneAxis } from '@/features/records/motion-record-schema';
import { formatQuantity, type UnitSystem } from '@/lib/units';

const axisWords: Record<PhoneAxis, string> = {
  x: 'Across the screen (x)',
  y: 'Along the screen (y)',
  z: 'Through the screen (z)',
};

/**
 * The recording cut to whole cycles, for the inspector to check before keeping it: the trace, the
 * numbers, which cycles to keep, and the gyro axis and direction when the automatic choice is wrong.
 */
export function ReviewPanel(props: {
  trace: SensorTrace;
  design: DesignData;
  joint: number;
  seat: number | null;
  defaultSign: 1 | -1;
  parentRate: number | null;
  system: UnitSystem;
  makeId: () => string;
  onKeep: (r: MotionRecord) => void;
  onDiscard: () => void;
}) {
  const { trace, design, joint, seat, parentRate, system } = props;
  const [axis, setAxis] = useState<PhoneAxis>(() => chooseAxis(trace));
  const [sign, setSign] = useState<1 | -1>(props.defaultSign);
  const [keep, setKeep] = useState<{ first: number; last: number } | undefined>(undefined);
  const [id] = useState(props.makeId);
  const [recordedAt] = useState(() => new Date().toISOString());
  const out = useMemo(
    () => trimToCycles(trace, { joint, seat, axis, sign, parentRateRadS: parentRate, keep }, recordedAt, id),
    [trace, joint, seat, axis, sign, parentRate, keep, recordedAt, id],
  );
  const rider = useMemo(() => (out.ok ? measuredRiderOf(design, [out.record]) : []), [out, design]);
  const q = (v: number, kind: 'time' | 'rate' | 'frequency') => formatQuantity(v, kind, system).text;

  return (
    <View style={styles.wrap}>
      <Text variant="heading">Recorded cycle</Text>
      <ChoiceChips<PhoneAxis>
        label="Gyro axis across the plane of motion (the one that swung most is chosen)"
        value={axis}
        options={(['x', 'y', 'z'] as const).map((a) => ({ value: a, label: axisWords[a] }))}
        onChange={(a) => {
          setAxis(a);
          setKeep(undefined);
        }}
      />
      {out.ok ? (
        <>
          <RateTrace
            timeS={out.record.timeS}
            values={out.record.rateRadS}
            summary={`Rate of pivot ${joint + 1} over ${out.record.cycles} whole cycles`}
          />
          <View style={styles.stats} accessibilityLabel="Recorded cycle summary">
            <Stat label="Whole cycles kept" value={`${out.record.cycles} of ${out.cyclesFound}`} />
            <Stat label="Duration" value={q(out.record.timeS[out.record.timeS.length - 1], 'time')} />
            <Stat label="Sample rate" value={q(out.record.sampleRateHz, 'frequency')} />
            <Stat label="Peak rate" value={q(Math.max(...out.record.rateRadS.map(Math.abs)), 'rate')} />
            <Stat
              label="Gyro bias removed"
              value={out.turning ? 'not separable (turning)' : q(out.record.biasRadS, 'rate')}
            />
          </View>
          <View style={styles.row}>
            <Button
              tone="quiet"
              label="Drop first cycle"
              disabled={out.keep.first >= out.keep.last}
              onPress={() => setKeep({ first: out.keep.first + 1, last: out.keep.last })}
            />
            <Button
              tone="quiet"
              label="Drop last cycle"
              disabled={out.keep.first >= out.keep.last}
              onPress={() => setKeep({ first: out.keep.first, last: out.keep.last - 1 })}
            />
            <Button tone="quiet" label="Keep all cycles" onPress={() => setKeep(undefined)} />
          </View>
          {seat !== null && !out.record.gxG ? (
            <Text variant="small" color={colors.danger}>
              The phone was not held with its screen across the plane of motion (the z axis did not swing
              most), so its accelerations cannot be read in the rider’s axes and are not kept.
            </Text>
          ) : null}
          <MeasuredRiderTable measured={rider} computed={[]} system={system} />
          <Caution />
        </>
      ) : (
        <Text role="alert" color={colors.danger}>
          {out.message}
        </Text>
      )}
      <Button
        tone="quiet"
        label={sign === 1 ? 'Reverse the direction' : 'Direction reversed · undo'}
        onPress={() => setSign(sign === 1 ? -1 : 1)}
      />
      <View style={styles.row}>
        {out.ok ? <Button label="Keep this record" onPress={() => props.onKeep(out.record)} /> : null}
        <Button tone="quiet" label="Discard and record again" onPress={props.onDiscard} />
      </View>
    </View>
  );
}

function Stat({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.stat}>
      <Text variant="small" muted>
        {label}
      </Text>
      <Text variant="figure">{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  stats: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  stat: { minWidth: 140, gap: 2 },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
