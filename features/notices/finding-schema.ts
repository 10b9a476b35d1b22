/**
 * Findings: what an inspection found wrong, its severity and the date it is due, and the state the notice
 * loop moves it through. Raised on the review desk, carried to the operator by the notices, so their shape
 * sits here, below the desk. Severity and state words and marks are in lib/vocabulary.
 */
import { z } from 'zod';

import { calendarDate } from '@/features/registry/schema';
import {
  findingSeverities,
  findingSeverityVocabulary,
  findingStates,
  type FindingSeverity,
} from '@/lib/vocabulary';

const findingSeveritySchema = z.enum(findingSeverities, {
  error: `One of ${findingSeverities.join(', ')}`,
});

/** Each severity's words and whether the ride may run while such a finding is open (`mayOperate`). */
export const severityInfo = findingSeverityVocabulary;

const findingStateSchema = z.enum(findingStates);

const sha256 = z.string().regex(/^[0-9a-f]{64}$/, 'Must be a photo reference (64 hex digits)');

const findingFields = {
  severity: findingSeveritySchema,
  description: z
    .string({ error: 'Required' })
    .trim()
    .min(1, 'Say what was found')
    .max(2000, 'At most 2000 characters'),
  /** The rule, standard clause or maker's instruction the deficiency breaches. */
  ruleRef: z
    .string()
    .trim()
    .max(300, 'At most 300 characters')
    .nullish()
    .transform((v) => (v ? v : null)),
  requiredAction: z
    .string()
    .trim()
    .max(2000, 'At most 2000 characters')
    .nullish()
    .transform((v) => (v ? v : null)),
  dueOn: calendarDate()
    .nullish()
    .transform((v) => v ?? null),
  /** Photos of the same inspection the finding points at (their SHA-256). */
  photoShas: z
    .array(sha256)
    .max(12, 'At most 12 photos')
    .default([])
    .transform((v) => [...new Set(v)]),
};

type FindingFields = {
  severity: FindingSeverity;
  requiredAction: string | null;
  dueOn: string | null;
};

/** Rules across fields, shared by create and (after merging with the stored finding) by update. */
export function findingProblems(f: FindingFields): { path: string; message: string }[] {
  const problems: { path: string; message: string }[] = [];
  if (f.severity !== 'note' && !f.requiredAction)
    problems.push({ path: 'requiredAction', message: 'Say what must be done' });
  if (f.severity === 'fix_by_date' && !f.dueOn)
    problems.push({ path: 'dueOn', message: 'A fix-by-date finding needs a due date' });
  return problems;
}

/** `POST /api/inspections/:id/findings`. */
export const findingInputSchema = z.object(findingFields).superRefine((f, ctx) => {
  for (const p of findingProblems(f)) ctx.addIssue({ code: 'custom', path: [p.path], message: p.message });
});
export type FindingInput = z.input<typeof findingInputSchema>;

/**
 * `PATCH /api/findings/:id`: any of the fields; `expectedUpdatedAt` (the `updatedAt` the editor started
 * from) makes a concurrent edit answer 409 instead of silently overwriting.
 */
export const findingPatchSchema = z
  .object({
    severity: findingFields.severity.optional(),
    description: findingFields.description.optional(),
    ruleRef: findingFields.ruleRef.optional(),
    requiredAction: findingFields.requiredAction.optional(),
    dueOn: findingFields.dueOn.optional(),
    photoShas: z.array(sha256).max(12, 'At most 12 photos').optional(),
    expectedUpdatedAt: z.string().min(1).optional(),
  })
  .refine((p) => Object.keys(p).some((k) => k !== 'expectedUpdatedAt'), { message: 'Nothing to change' });
export type FindingPatch = z.input<typeof findingPatchSchema>;

export const findingSchema = z.object({
  id: z.string(),
  inspectionId: z.string(),
  rideId: z.string(),
  /**
   * What people call the finding by: its number on the ride (1, 2, 3… over all the ride's inspections,
   * never reused), or its number in its inspection for a finding stored before rides numbered them.
   */
  number: z.number().int(),
  /** 1, 2, 3… within its inspection. */
  inspectionNumber: z.number().int().optional(),
  severity: findingSeveritySchema,
  description: z.string(),
  ruleRef: z.string().nullable(),
  requiredAction: z.string().nullable(),
  dueOn: z.string().nullable(),
  photoShas: z.array(z.string()),
  state: findingStateSchema,
  createdAt: z.string(),
  createdByName: z.string().nullable(),
  updatedAt: z.string(),
  updatedByName: z.string().nullable(),
  closedAt: z.string().nullable(),
  closedByName: z.string().nullable(),
  /** The last comment on closing or reopening. */
  stateNote: z.string().nullable(),
  /** What the verifier accepted as evidence on closing. */
  closeEvidence: z
    .object({
      photoShas: z.array(z.string()),
      reference: z.string().nullable(),
      correctiveActions: z.number().int(),
    })
    .nullable()
    .optional(),
});
export type Finding = z.infer<typeof findingSchema>;
export const findingResponseSchema = z.object({ finding: findingSchema });
export const findingListResponseSchema = z.object({ findings: z.array(findingSchema) });
