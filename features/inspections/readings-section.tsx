import { randomUUID } from 'expo-crypto';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { answerOfReading, checkReading, type Draft } from '@/features/records';
import { type PendingReading, PlausibilityPrompt } from '@/features/inspections/plausibility-prompt';
import { type Reading, type ReadingKind } from '@/features/records/schema';
import {
  MeasuredWithPicker,
  measuredWithProblem,
  nothingChosen,
  snapshotOf,
  type MeasuredWith,
} from '@/features/instruments/ui';
import { type Instrument, measuredWithWords } from '@/features/instruments/schema';
import { localDay } from '@/lib/dates';
import type { DesignData, DesignMotion } from '@/features/loads/design-schema';
import { MotionPicture } from '@/features/tap-timer/ui';
import { type DisplayUnit, type QuantityKind, type UnitSystem, displayUnits, toSI } from '@/lib/units';
import { formatMeasured, formatSpreadOf, formatStated, normaliseEntered } from '@/lib/measured-format';

/** What each kind of reading is and in which quantity; how it was measured is the inspector's to say. */
const readingSpec: Record<Exclude<ReadingKind, 'other'>, { title: string; quantity: QuantityKind }> = {
  speed: { title: 'Speed', quantity: 'rate' },
  period: { title: 'Period (one turn or one swing)', quantity: 'time' },
  amplitude: { title: 'Swing amplitude (each side)', quantity: 'angle' },
  pin_diameter: { title: 'Pin diameter', quantity: 'lengthSmall' },
  clearance: { title: 'Bushing clearance (diametral)', quantity: 'lengthSmall' },
};

const quantityOf = (r: Reading): QuantityKind =>
  readingSpec[r.kind as Exclude<ReadingKind, 'other'>]?.quantity ?? 'length';

/** A recorded reading as the inspector typed it (or to its spread, when the tap timer measured it). */
function recordedValue(r: Reading, system: UnitSystem) {
  return formatMeasured(r.valueSI, quantityOf(r), system, {
    entered: r.entered,
    unit: r.unit,
    spreadSI: r.spreadSI,
  });
}

type Props = {
  draft: Draft;
  design: DesignData | null;
  system: UnitSystem;
  onAdd: (r: Reading) => void;
  onRemove: (id: string) => void;
  /** The instrument register as the phone holds it. */
  instruments?: Instrument[];
  /** A tap timer for period readings, when the screen offers one. */
  renderTimer?: (
    onUse: (periodS: number, spreadS: number) => void,
    per: 'revolution' | 'swing',
  ) => React.ReactNode;
  /** Each pivot's card, so the screen can bring one into view (a scanned plate's pivot). */
  pivotRef?: (joint: number, node: View | null) => void;
  /** The pivot whose plate was scanned to come here: its card says so. */
  scannedJoint?: number | null;
};

/** Per pivot: the motion readings its design motion calls for, and pin and bushing wear. */
export function ReadingsSection({
  draft,
  design,
  system,
  onAdd,
  onRemove,
  renderTimer,
  instruments = [],
  pivotRef,
  scannedJoint = null,
}: Props) {
  if (!design)
    return (
      <Card>
        <Text muted>
          This ride has no design data on the phone, so readings cannot be checked. Sync, then try again.
        </Text>
      </Card>
    );
  return (
    <View style={styles.root}>
      {design.bodies.map((body, joint) => {
        const motion = design.motion.find((m) => m.joint === joint);
        const pivot = design.pivots.find((p) => p.joint === joint);
        const kinds: Exclude<ReadingKind, 'other'>[] = [
          ...(motion?.kind === 'constant' ? (['speed', 'period'] as const) : []),
          ...(motion?.kind === 'swing' ? (['amplitude', 'period'] as const) : []),
          'pin_diameter',
          'clearance',
        ];
        const taken = draft.readings.filter((r) => r.joint === joint);
        const title = `Pivot ${joint + 1} · ${pivot?.name ?? body.name}`;
        return (
          <View
            key={joint}
            ref={pivotRef ? (node) => pivotRef(joint, node) : undefined}
            tabIndex={-1}
            accessibilityLabel={scannedJoint === joint ? `${title}, opened from its plate` : undefined}
          >
            <Card>
              <Text variant="heading">{title}</Text>
              {scannedJoint === joint ? (
                <Text variant="small" color={colors.accent}>
                  Opened from its plate
                </Text>
              ) : null}
              {pivot ? (
                <Text variant="small" muted>
                  Pin nominal {formatStated(pivot.nominalDiameterM, 'lengthSmall', system).text}, minimum{' '}
                  {formatStated(pivot.minimumDiameterM, 'lengthSmall', system).text}; clearance limit{' '}
                  {formatStated(pivot.maxClearanceM, 'lengthSmall', system).text}
                </Text>
              ) : null}
              {kinds.map((kind) => (
                <ReadingInput
                  key={kind}
                  kind={kind}
                  joint={joint}
                  bodyName={body.name}
                  system={system}
                  onAdd={onAdd}
                  instruments={instruments}
                  timer={kind === 'period' ? renderTimer : undefined}
                  per={motion?.kind === 'swing' ? 'swing' : 'revolution'}
                  motion={motion}
                />
              ))}
              {taken.length > 0 ? (
                <View style={styles.taken}>
                  <Text variant="label" muted>
                    RECORDED
                  </Text>
                  {taken.map((r) => (
                    <View key={r.id} style={styles.takenRow}>
                      <Text style={styles.takenText}>
                        {r.label}: <Text variant="figure">{recordedValue(r, system).text}</Text>
                        {r.spreadSI ? (
                          <Text variant="small" muted>
                            {' '}
                            {formatSpreadOf(r.spreadSI, quantityOf(r), system, recordedValue(r, system).unit)}
                          </Text>
                        ) : null}
                        <Text variant="small" muted>
                          {' · '}
                          {measuredWithWords(r)}
                        </Text>
                        {r.plausibility ? (
                          <Text variant="small" color={colors.near}>
                            {'\n'}Far from the design ({r.plausibility.ratio.toFixed(2)} ×), confirmed by you
                          </Text>
                        ) : null}
                        {answerOfReading(draft, r.id) ? (
                          <Text variant="small" muted>
                            {'\n'}From the checklist: {answerOfReading(draft, r.id)?.text} (change it there)
                          </Text>
                        ) : null}
                      </Text>
                      {/* One value, kept in one place: a checklist value is changed or cleared in the checklist. */}
                      {answerOfReading(draft, r.id) ? null : (
                        <Button
                          label="Remove"
                          tone="quiet"
                          onPress={() => onRemove(r.id)}
                          accessibilityLabel={`Remove ${r.label}`}
                        />
                      )}
                    </View>
                  ))}
                </View>
              ) : null}
            </Card>
          </View>
        );
      })}
    </View>
  );
}

function ReadingInput({
  kind,
  joint,
  bodyName,
  system,
  onAdd,
  timer,
  per,
  instruments,
  motion,
}: {
  instruments: Instrument[];
  per: 'revolution' | 'swing';
  kind: Exclude<ReadingKind, 'other'>;
  joint: number;
  bodyName: string;
  system: UnitSystem;
  onAdd: (r: Reading) => void;
  timer?: Props['renderTimer'];
  /** The joint's design motion: a reading far from it waits for the inspector's answer. */
  motion?: DesignMotion;
}) {
  const spec = readingSpec[kind];
  const unit = displayUnits(spec.quantity, system)[0];
  const [timing, setTiming] = useState(false);
  const label = `${bodyName}: ${spec.title.toLowerCase()}`;
  const [pending, setPending] = useState<PendingReading | null>(null);
  const offer = (reading: Reading) => {
    const check = checkReading(motion, reading);
    if (check && !check.plausible) setPending({ reading, check });
    else onAdd(reading);
  };
  const add: AddReading = (valueSI, method, spreadSI = null, instrument, entered, note) => {
    offer({
      id: randomUUID(),
      kind,
      joint,
      label,
      valueSI,
      unit: unit.label,
      ...(entered !== undefined && { entered }),
      method,
      ...(instrument !== undefined && { instrument }),
      spreadSI,
      takenAt: new Date().toISOString(),
      ...(note ? { note } : {}),
    });
  };
  return (
    <View style={styles.input}>
      {/* The tap timer shows the same picture on its pad's side. */}
      {kind === 'period' && !timing ? <MotionPicture kind={per} /> : null}
      {pending ? (
        <PlausibilityPrompt
          pending={pending}
          valueText={recordedValue(pending.reading, system).text}
          onKeep={(confirmed) => {
            setPending(null);
            onAdd(confirmed);
          }}
          onMeasureAgain={() => {
            setPending(null);
            if (pending.reading.method === 'tap_timer') setTiming(true);
          }}
        />
      ) : null}
      <TypedReading kind={kind} bodyName={bodyName} unit={unit} instruments={instruments} add={add} />
      {timer ? (
        timing ? (
          timer((periodS, spreadS) => {
            add(periodS, 'tap_timer', spreadS);
            setTiming(false);
          }, per)
        ) : (
          <Button label="Time it with taps" tone="quiet" onPress={() => setTiming(true)} />
        )
      ) : null}
    </View>
  );
}

/** Adds a reading taken by hand or by the tap timer (spread, instrument, typed text and note when known). */
type AddReading = (
  valueSI: number,
  method: Reading['method'],
  spreadSI?: number | null,
  instrument?: Reading['instrument'],
  entered?: string,
  note?: string,
) => void;

/** A reading typed in, with how it was measured; the value is checked here before it is added. */
function TypedReading({
  kind,
  bodyName,
  unit,
  instruments,
  add,
}: {
  kind: Exclude<ReadingKind, 'other'>;
  bodyName: string;
  unit: DisplayUnit;
  instruments: Instrument[];
  add: AddReading;
}) {
  const spec = readingSpec[kind];
  const [text, setText] = useState('');
  const [error, setError] = useState<string | undefined>();
  const [measured, setMeasured] = useState<MeasuredWith>(nothingChosen);
  const [measuredError, setMeasuredError] = useState<string | undefined>();
  const submit = () => {
    // Kept as typed (normalised), so the record shows the inspector's own digits and precision.
    const entered = normaliseEntered(text);
    const v = Number(entered);
    if (entered === null || !Number.isFinite(v)) return setError('Enter a number');
    if (v <= 0 && kind !== 'clearance') return setError('Must be greater than 0');
    if (v < 0) return setError('Cannot be negative');
    setError(undefined);
    const missing = measuredWithProblem(measured, localDay());
    if (missing || !measured.method) return setMeasuredError(missing ?? undefined);
    setMeasuredError(undefined);
    setText('');
    const { method, instrument, note } = measured;
    // Each reading says how it was taken: the next one starts with nothing chosen again.
    setMeasured(nothingChosen);
    add(
      toSI(v, spec.quantity, unit.mathjs),
      method,
      null,
      instrument ? snapshotOf(instrument) : null,
      entered,
      method === 'other' ? note.trim() : undefined,
    );
  };
  return (
    <>
      <View style={styles.inputRow}>
        <View style={styles.inputField}>
          <TextField
            label={spec.title}
            unit={unit.label}
            value={text}
            onChangeText={setText}
            error={error}
            inputMode="decimal"
            onSubmitEditing={submit}
          />
        </View>
        <Button
          label="Add"
          tone="quiet"
          onPress={submit}
          accessibilityLabel={`Add ${spec.title.toLowerCase()} for ${bodyName}`}
        />
      </View>
      {/* Asked once a value is typed, so a pivot's card stays short until it is used. */}
      {text.trim() !== '' || measured.method !== null || measuredError ? (
        <MeasuredWithPicker
          kind={kind}
          instruments={instruments}
          today={localDay()}
          value={measured}
          onChange={(m) => {
            setMeasured(m);
            setMeasuredError(undefined);
          }}
          error={measuredError}
        />
      ) : null}
    </>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.lg },
  input: { gap: space.sm, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  inputRow: { flexDirection: 'row', alignItems: 'flex-end', gap: space.sm },
  inputField: { flex: 1 },
  taken: { gap: space.xs, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  takenRow: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
  takenText: { flexShrink: 1 },
});
