/**
 * An inspection being recorded on the phone, and the pure operations on it. Every change returns a new
 * draft, which the screen saves to the device database straight away (nothing typed is ever only in
 * memory).
 */
import { type OpenBulletin, bulletinChecklistItem } from '@/features/bulletins/schema';
import { readingLink } from '@/features/records/checklist-limits';
import type { DesignData } from '@/features/loads/design-schema';
import type { ChecklistTemplate } from '@/features/registry/schema';
import {
  type ChecklistAnswer,
  type Declaration,
  type DevicePreview,
  type InspectionRecord,
  type InspectionType,
  type PhotoRef,
  type Reading,
  type TestRun,
  inspectionRecordSchema,
  type DraftProblem,
} from '@/features/records/schema';
import type { MotionRecord } from '@/features/records/motion-record-schema';

export type Draft = {
  id: string;
  rideId: string;
  rideName: string;
  designVersionId: string | null;
  templateId: string | null;
  templateVersion: number | null;
  type: InspectionType;
  startedAt: string;
  updatedAt: string;
  checklist: ChecklistAnswer[];
  readings: Reading[];
  photos: PhotoRef[];
  notes: string;
  /** Set on a correction of an inspection a supervisor returned: the id of the one it corrects. */
  amendsId?: string | null;
  /** Ride cycles recorded with the phone's motion sensors; absent from drafts saved before. */
  motionRecords?: MotionRecord[];
  /** A daily pre-opening check's test runs. */
  testRuns?: TestRun[];
};

export function newDraft(args: {
  id: string;
  ride: { id: string; name: string };
  designVersionId: string | null;
  template: ChecklistTemplate | null;
  type: InspectionType;
  now: Date;
  /** The makers' bulletins still open on the ride: each adds an item after the template's. */
  bulletins?: readonly OpenBulletin[];
}): Draft {
  const at = args.now.toISOString();
  const checklist: ChecklistAnswer[] = [
    ...(args.template?.version.content.areas ?? []).flatMap((area) =>
      area.items.map((item) => ({ itemId: item.id, area: area.title, text: item.text, result: null })),
    ),
    ...(args.bulletins ?? []).map(bulletinChecklistItem),
  ];
  return {
    id: args.id,
    rideId: args.ride.id,
    rideName: args.ride.name,
    designVersionId: args.designVersionId,
    templateId: args.template?.id ?? null,
    templateVersion: args.template?.version.version ?? null,
    type: args.type,
    startedAt: at,
    updatedAt: at,
    checklist,
    readings: [],
    photos: [],
    notes: '',
  };
}

/**
 * A correction of a returned inspection: a new draft that starts from everything the original recorded
 * (answers, readings, photos, notes) and is sent as an amendment of it. The original stays as it was.
 */
export function newCorrection(args: {
  id: string;
  original: InspectionRecord;
  rideName: string;
  now: Date;
}): Draft {
  const at = args.now.toISOString();
  const o = args.original;
  return {
    id: args.id,
    rideId: o.rideId,
    rideName: args.rideName,
    designVersionId: o.designVersionId,
    templateId: o.templateId,
    templateVersion: o.templateVersion,
    type: o.type,
    startedAt: at,
    updatedAt: at,
    checklist: o.checklist.map((a) => ({ ...a })),
    readings: o.readings.map((r) => ({ ...r })),
    photos: o.photos.map((p) => ({ ...p })),
    notes: o.notes ?? '',
    amendsId: o.id,
    ...(o.motionRecords ? { motionRecords: o.motionRecords.map((r) => ({ ...r })) } : {}),
  };
}

const touch = (d: Draft, now: Date): Draft => ({ ...d, updatedAt: now.toISOString() });

export function answerItem(d: Draft, itemId: string, patch: Partial<ChecklistAnswer>, now: Date): Draft {
  return touch(
    { ...d, checklist: d.checklist.map((a) => (a.itemId === itemId ? { ...a, ...patch } : a)) },
    now,
  );
}

export function addReading(d: Draft, reading: Reading, now: Date): Draft {
  return touch({ ...d, readings: [...d.readings, reading] }, now);
}

export function removeReading(d: Draft, id: string, now: Date): Draft {
  return touch({ ...d, readings: d.readings.filter((r) => r.id !== id) }, now);
}

export function addPhoto(d: Draft, photo: PhotoRef, now: Date): Draft {
  return touch({ ...d, photos: [...d.photos, photo] }, now);
}

export function updatePhoto(
  d: Draft,
  id: string,
  patch: Partial<Pick<PhotoRef, 'caption' | 'joint' | 'checklistItemId'>>,
  now: Date,
): Draft {
  return touch({ ...d, photos: d.photos.map((p) => (p.id === id ? { ...p, ...patch } : p)) }, now);
}

export function removePhoto(d: Draft, id: string, now: Date): Draft {
  return touch({ ...d, photos: d.photos.filter((p) => p.id !== id) }, now);
}

export function setNotes(d: Draft, notes: string, now: Date): Draft {
  return touch({ ...d, notes }, now);
}

/**
 * What must be done before the inspection can be submitted: every item answered, a note on every
 * failed item, a photo where the template asks for one, and a value where it asks for a measurement.
 */
export function draftProblems(
  d: Draft,
  template: ChecklistTemplate | null,
  design: DesignData | null = null,
): DraftProblem[] {
  const problems: DraftProblem[] = [];
  const items = new Map(
    (template?.version.content.areas ?? []).flatMap((a) => a.items.map((i) => [i.id, i] as const)),
  );
  for (const a of d.checklist) {
    if (a.result === null) problems.push({ itemId: a.itemId, message: `Not answered: ${a.text}` });
    if (a.result === 'fail' && !a.note?.trim())
      problems.push({ itemId: a.itemId, message: `Say what failed: ${a.text}` });
    const item = items.get(a.itemId);
    if (item?.photoRequired && a.result !== 'na' && !d.photos.some((p) => p.checklistItemId === a.itemId))
      problems.push({ itemId: a.itemId, message: `Needs a photo: ${a.text}` });
    if (item?.measurementRequired && a.result !== 'na' && !a.measurement)
      problems.push({ itemId: a.itemId, message: `Needs a measurement: ${a.text}` });
    // The status seen at entry (features/inspections/checklist-limits); the server applies the same rule.
    if (a.result === 'pass' && a.measurement?.status === 'over' && !a.overLimitReason?.trim())
      problems.push({ itemId: a.itemId, message: `Over its limit — mark Fail or give a reason: ${a.text}` });
    // A pin or clearance value is also its pivot's reading, which must say how it was measured.
    const link = item ? readingLink(item) : null;
    if (
      link &&
      a.result !== 'na' &&
      a.measurement &&
      !a.measurement.readingId &&
      design?.pivots.some((p) => p.joint === link.joint)
    )
      problems.push({ itemId: a.itemId, message: `Say how it was measured: ${a.text}` });
  }
  return problems;
}

/**
 * The record that goes into the outbox; validated by the same schema the server applies. The server
 * refuses a record without the inspector's declaration, which the submit step makes.
 */
export function toRecord(
  d: Draft,
  preview: DevicePreview | null,
  now: Date,
  declaration?: Declaration,
): InspectionRecord {
  return inspectionRecordSchema.parse({
    id: d.id,
    rideId: d.rideId,
    designVersionId: d.designVersionId,
    templateId: d.templateId,
    templateVersion: d.templateVersion,
    type: d.type,
    startedAt: d.startedAt,
    submittedAt: now.toISOString(),
    checklist: d.checklist,
    readings: d.readings,
    photos: d.photos,
    notes: d.notes || undefined,
    preview,
    amendsId: d.amendsId ?? null,
    declaration,
    motionRecords: d.motionRecords?.length ? d.motionRecords : undefined,
    testRuns: d.testRuns?.length ? d.testRuns : undefined,
  });
}

/** Keeps a recorded ride cycle for its joint, replacing an earlier record of the same joint. */
export function putMotionRecord(d: Draft, record: MotionRecord, now: Date): Draft {
  const others = (d.motionRecords ?? []).filter((r) => r.joint !== record.joint);
  return touch({ ...d, motionRecords: [...others, record] }, now);
}

export function removeMotionRecord(d: Draft, id: string, now: Date): Draft {
  return touch({ ...d, motionRecords: (d.motionRecords ?? []).filter((r) => r.id !== id) }, now);
}

/** Counts for the progress line: answered / total, failed, readings, photos. */
export function draftProgress(d: Draft) {
  return {
    answered: d.checklist.filter((a) => a.result !== null).length,
    total: d.checklist.length,
    failed: d.checklist.filter((a) => a.result === 'fail').length,
    readings: d.readings.length,
    photos: d.photos.length,
  };
}
