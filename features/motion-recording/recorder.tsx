import { randomUUID } from 'expo-crypto';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { ChoiceChips } from '@/components/choice-chips';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import type { DesignData } from '@/features/loads/design-schema';
import { MountingWords, RecordLimitsWords } from '@/features/motion-recording/instructions';
import { attributeJoint, defaultSign } from '@/features/motion-recording/processing';
import { RateTrace } from '@/features/motion-recording/rate-trace';
import { ReviewPanel } from '@/features/motion-recording/review-panel';
import { useMotionCapture } from '@/features/motion-recording/use-motion-capture';
import type { MotionRecord } from '@/features/records/motion-record-schema';
import type { Reading } from '@/features/records/schema';
import { formatQuantity, type UnitSystem } from '@/lib/units';

type Mount = 'arm' | 'seat';

export type RecorderProps = {
  design: DesignData;
  readings: readonly Reading[];
  records: readonly MotionRecord[];
  system: UnitSystem;
  onKeep: (record: MotionRecord) => void;
  onRemove: (id: string) => void;
};

const jointName = (design: DesignData, joint: number) =>
  `Pivot ${joint + 1} · ${design.pivots.find((p) => p.joint === joint)?.name ?? design.bodies[joint]?.name ?? ''}`;

/**
 * Recording a ride cycle with the phone's motion sensors: choose where the phone rides, fix it as shown,
 * start, watch the live trace, stop, then check the whole cycles found and keep the record.
 */
export function MotionRecorder({ design, readings, records, system, onKeep, onRemove }: RecorderProps) {
  const [mount, setMount] = useState<Mount>('arm');
  const [joint, setJoint] = useState(0);
  const [seat, setSeat] = useState<number | null>(null);
  const capture = useMotionCapture();
  const inSeat = mount === 'seat' && seat !== null;
  const body = inSeat ? design.seats[seat].body : joint;
  const { joint: effectiveJoint, parentRateRadS: parentRate } = attributeJoint(design, body, readings);

  const jointOptions = design.bodies.map((_, i) => ({ value: String(i), label: jointName(design, i) }));
  const seatOptions = design.seats.map((s, i) => ({ value: String(i), label: s.name }));

  return (
    <Card style={styles.card}>
      <Text variant="heading">Ride cycle from the phone’s motion sensors</Text>
      {records.map((r) => (
        <View key={r.id} style={styles.kept} accessibilityLabel={`Motion record of pivot ${r.joint + 1}`}>
          <Text>
            {jointName(design, r.joint)}
            {r.seat !== null ? ` · in ${design.seats[r.seat]?.name ?? 'a seat'}` : ''}
          </Text>
          <Text variant="small" muted>
            {r.cycles} whole cycle{r.cycles === 1 ? '' : 's'} ·{' '}
            {formatQuantity(r.timeS[r.timeS.length - 1], 'time', system).text} · {Math.round(r.sampleRateHz)}{' '}
            samples a second
          </Text>
          <Button tone="quiet" label="Remove this record" onPress={() => onRemove(r.id)} />
        </View>
      ))}

      {capture.state === 'idle' || capture.state === 'asking' ? (
        <View style={styles.block}>
          <ChoiceChips<Mount>
            label="Where the phone rides"
            value={mount}
            options={[
              { value: 'arm', label: 'Fixed to an arm or gondola' },
              ...(design.seats.length ? [{ value: 'seat' as const, label: 'Carried in a seat' }] : []),
            ]}
            onChange={(m) => {
              setMount(m);
              if (m === 'seat' && seat === null) setSeat(0);
            }}
          />
          {mount === 'seat' && design.seats.length ? (
            <ChoiceChips
              label="Seat"
              value={seat === null ? null : String(seat)}
              options={seatOptions}
              onChange={(v) => setSeat(Number(v))}
            />
          ) : (
            <ChoiceChips
              label="Pivot whose arm carries the phone"
              value={String(joint)}
              options={jointOptions}
              onChange={(v) => setJoint(Number(v))}
            />
          )}
          <MountingWords inSeat={mount === 'seat'} />
          {effectiveJoint !== body ? (
            <Text variant="small">
              This body is fixed to the one below it, so the record stands for the motion of{' '}
              {jointName(design, effectiveJoint)}.
            </Text>
          ) : null}
          <ParentWords joint={effectiveJoint} parentRate={parentRate} system={system} />
          <RecordLimitsWords />
          {capture.error ? (
            <Text role="alert" color={colors.danger}>
              {capture.error}
            </Text>
          ) : null}
          <Button
            label="Start recording"
            busy={capture.state === 'asking'}
            onPress={() => void capture.start()}
          />
        </View>
      ) : null}

      {capture.state === 'recording' ? (
        <View style={styles.block}>
          <Text variant="label" accessibilityLiveRegion="polite">
            Recording · {formatQuantity(capture.live.durationS, 'time', system).text} · {capture.live.count}{' '}
            readings
          </Text>
          <RateTrace
            timeS={capture.live.timeS}
            values={capture.live.values}
            summary="Live trace of the rotation rate over the last few seconds"
          />
          <Text variant="small" muted>
            Let the ride run at least two whole cycles, then stop.
          </Text>
          {capture.error ? (
            <Text role="alert" color={colors.danger}>
              {capture.error}
            </Text>
          ) : null}
          <Button label="Stop recording" tone="accent" onPress={capture.stop} />
        </View>
      ) : null}

      {capture.state === 'stopped' ? (
        <ReviewPanel
          trace={capture.trace.current}
          design={design}
          joint={effectiveJoint}
          seat={inSeat ? seat : null}
          defaultSign={defaultSign(design, inSeat ? seat : null)}
          parentRate={parentRate}
          system={system}
          makeId={randomUUID}
          onKeep={(r) => {
            onKeep(r);
            capture.reset();
          }}
          onDiscard={capture.reset}
        />
      ) : null}
    </Card>
  );
}

function ParentWords({
  joint,
  parentRate,
  system,
}: {
  joint: number;
  parentRate: number | null;
  system: UnitSystem;
}) {
  if (joint === 0) return null;
  return parentRate === null ? (
    <Text variant="small" color={colors.danger}>
      The pivots below this one do not turn steadily, so their motion cannot be taken off what the phone
      feels. This record will not replace the pivot’s design motion; in a seat, its accelerations still count.
    </Text>
  ) : (
    <Text variant="small">
      The phone feels the pivots below too: their steady rate (
      {formatQuantity(parentRate, 'rate', system).text}) is taken off to leave this pivot’s own motion.
    </Text>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.md },
  block: { gap: space.md },
  kept: { gap: space.xs, paddingVertical: space.sm, borderBottomWidth: 1, borderBottomColor: colors.border },
});
