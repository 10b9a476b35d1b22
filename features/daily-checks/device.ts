/**
 * The operator's daily checks on the phone: started, kept and queued with the same drafts, outbox and
 * signing as an inspector's inspections (features/device-db), from the rides and daily checklists the
 * last pull left on the phone (features/sync). Works with no signal; sync sends the outbox when it returns.
 */
import { DAILY_CHECK_TYPE } from '@/features/daily-checks/schema';
import {
  type DeviceDb,
  type OutboxItem,
  listDrafts,
  listOutbox,
  loadDraft,
  saveDraft,
  submitDraft,
} from '@/features/device-db';
import { type Draft, draftProblems, newDraft, toRecord } from '@/features/records';
import type { Declaration, InspectionRecord, TestRun } from '@/features/records/schema';
import {
  type ChecklistTemplate,
  checklistTemplateSchema,
  pickChecklistTemplate,
} from '@/features/registry/schema';
import type { RideSummary } from '@/features/rides/schema';
import { readRide, readRides, readTemplates } from '@/features/sync';

/** The class's daily pre-opening checklist on the phone; null when the inspection body has set none. */
export async function dailyTemplateFor(dev: DeviceDb, rideClass: string): Promise<ChecklistTemplate | null> {
  const templates = (await readTemplates(dev, rideClass)).flatMap((raw) => {
    const parsed = checklistTemplateSchema.safeParse(raw);
    return parsed.success ? [parsed.data] : [];
  });
  return pickChecklistTemplate(templates, rideClass, DAILY_CHECK_TYPE).template;
}

export type DailyRide = {
  ride: RideSummary;
  hasTemplate: boolean;
  /** The daily check being filled in on this phone, if any. */
  draftId: string | null;
};

/** The company's rides on the phone, with whether each has a daily checklist and a check in progress. */
export async function readDailyRides(dev: DeviceDb): Promise<DailyRide[]> {
  const [rides, drafts] = await Promise.all([readRides(dev), listDrafts(dev)]);
  const result: DailyRide[] = [];
  for (const ride of rides) {
    let draftId: string | null = null;
    for (const d of drafts.filter((x) => x.rideId === ride.id)) {
      const data = (await loadDraft<Draft>(dev, d.id))?.data;
      if (data?.type === DAILY_CHECK_TYPE) draftId = d.id;
    }
    result.push({ ride, hasTemplate: (await dailyTemplateFor(dev, ride.rideClass)) !== null, draftId });
  }
  return result.sort((a, b) => a.ride.name.localeCompare(b.ride.name));
}

/** A new daily check of `rideId`, saved on the phone: the class's daily checklist, one test run to fill. */
export async function startDailyCheck(dev: DeviceDb, rideId: string, id: string, now: Date): Promise<Draft> {
  const ride = await readRide(dev, rideId);
  if (!ride) throw new Error('This ride is not on the phone. Connect once so it can be fetched.');
  const template = await dailyTemplateFor(dev, ride.rideClass);
  if (!template)
    throw new Error(`The inspection body has set no daily checklist for ${ride.name}'s ride class yet.`);
  const draft: Draft = {
    ...newDraft({ id, ride, designVersionId: null, template, type: DAILY_CHECK_TYPE, now }),
    testRuns: [],
  };
  await saveDraft(dev, { id: draft.id, rideId: draft.rideId, data: draft }, now);
  return draft;
}

/**
 * What must be done before a daily check can be sent: what an inspection needs (every item answered, a
 * note on a failure, a value where the checklist asks, features/records draftProblems) and a test run.
 */
export function dailyCheckProblems(d: Draft, template: ChecklistTemplate | null): string[] {
  const problems = draftProblems(d, template).map((p) => p.message);
  if (!d.testRuns?.length)
    problems.push('Record the test run: the empty cycles run and how the ride behaved');
  return problems;
}

/** A daily check with a failed item or test run: the ride must not open on it. */
export const dailyCheckFailed = (d: Pick<Draft, 'checklist' | 'testRuns'>): boolean =>
  d.checklist.some((a) => a.result === 'fail') || (d.testRuns ?? []).some((t) => t.result === 'fail');

/** Sets the check's one test run (the maker's empty cycles before opening). */
export function setTestRun(d: Draft, run: TestRun | null, now: Date): Draft {
  return { ...d, testRuns: run ? [run] : [], updatedAt: now.toISOString() };
}

/** Into the outbox, signed, like an inspection (no load check: `preview` null). */
export async function submitDailyCheck(
  dev: DeviceDb,
  draft: Draft,
  template: ChecklistTemplate | null,
  declaration: Declaration,
  now: Date,
): Promise<InspectionRecord> {
  const problems = dailyCheckProblems(draft, template);
  if (problems.length) throw new Error(problems.join('; '));
  return submitDraft(dev, toRecord(draft, null, now, declaration), now);
}

/** The daily checks this person sent from this phone, newest first, with where each stands. */
export async function sentDailyChecks(dev: DeviceDb): Promise<OutboxItem[]> {
  const items = await listOutbox(dev);
  return items
    .filter((i) => i.record.type === DAILY_CHECK_TYPE)
    .sort((a, b) => b.record.submittedAt.localeCompare(a.record.submittedAt));
}
