/**
 * Entering a checklist value on the phone, as one change of the draft. When the item measures a pivot's
 * pin or bushing, the value IS that pivot's reading: the reading is created (once the inspector has said
 * how it was measured) or updated with it, and the answer keeps its id, so the checklist and the readings
 * can never hold two different values for one measurement. Pure: no React.
 */
import type { Draft } from '@/features/records/draft';
import type { ChecklistAnswer, InstrumentSnapshot, Reading, ReadingKind } from '@/features/records/schema';

type Measurement = NonNullable<ChecklistAnswer['measurement']>;

export type ReadingTarget = { kind: ReadingKind; joint: number; label: string };
type MeasuredBy = { method: Reading['method']; instrument: InstrumentSnapshot | null };

/** What each shared pivot quantity is called in a reading's label (the readings form uses the same words). */
export const sharedReadingTitle: Partial<Record<ReadingKind, string>> = {
  pin_diameter: 'pin diameter',
  clearance: 'bushing clearance (diametral)',
};

/**
 * Sets an item's value (null clears it). With `target`, the linked reading follows: updated when it
 * exists, created when `measuredBy` says how it was taken, removed when the value is cleared.
 */
export function enterChecklistValue(
  d: Draft,
  args: {
    itemId: string;
    measurement: Omit<Measurement, 'readingId'> | null;
    target: ReadingTarget | null;
    measuredBy: MeasuredBy | null;
    now: Date;
    newId: () => string;
  },
): Draft {
  const answer = d.checklist.find((a) => a.itemId === args.itemId);
  if (!answer) return d;
  const linkedId = answer.measurement?.readingId;
  const linked = linkedId ? d.readings.find((r) => r.id === linkedId) : undefined;
  let readings = d.readings;
  let measurement: Measurement | null = args.measurement ? { ...args.measurement } : null;

  if (!measurement) {
    if (linked) readings = readings.filter((r) => r.id !== linked.id);
  } else if (args.target) {
    const value = {
      valueSI: measurement.valueSI,
      unit: measurement.unit,
      ...(measurement.entered !== undefined && { entered: measurement.entered }),
    };
    if (linked) {
      const by = args.measuredBy ?? { method: linked.method, instrument: linked.instrument ?? null };
      readings = readings.map((r) => (r.id === linked.id ? { ...r, ...value, ...by } : r));
      measurement = { ...measurement, readingId: linked.id };
    } else if (args.measuredBy) {
      const reading: Reading = {
        id: args.newId(),
        kind: args.target.kind,
        joint: args.target.joint,
        label: args.target.label.slice(0, 120),
        ...value,
        method: args.measuredBy.method,
        instrument: args.measuredBy.instrument,
        spreadSI: null,
        takenAt: args.now.toISOString(),
        note: `Entered in the checklist: ${answer.text}`.slice(0, 2000),
      };
      readings = [...readings, reading];
      measurement = { ...measurement, readingId: reading.id };
    }
  }
  return {
    ...d,
    readings,
    checklist: d.checklist.map((a) => (a.itemId === args.itemId ? { ...a, measurement } : a)),
    updatedAt: args.now.toISOString(),
  };
}

/** The checklist answer a reading belongs to, when it was entered there. */
export function answerOfReading(d: Pick<Draft, 'checklist'>, readingId: string): ChecklistAnswer | undefined {
  return d.checklist.find((a) => a.measurement?.readingId === readingId);
}
