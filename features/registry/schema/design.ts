import { id, requiredText } from '@/features/registry/schema/fields';
import { designDataSchema } from '@/features/loads/design-schema';
import { rideSummarySchema } from '@/features/rides/schema';
import { z } from 'zod';

// ——— design data ———

export const designOrigins = ['editor', 'import_csv', 'import_json', 'seed'] as const;
export const designOriginSchema = z.enum(designOrigins);
export type DesignOrigin = z.infer<typeof designOriginSchema>;

/**
 * Whether a version is the one analyses and phones use. A version that loosens a limit waits (`pending`)
 * until a second person approves it; `rejected` ones stay in the history. Versions stored before approval
 * existed are in force; the fields are optional so those records, cached on phones, still parse.
 */
export const designApprovalStates = ['pending', 'in_force', 'rejected'] as const;
const designApprovalStateSchema = z.enum(designApprovalStates);

/** A version without its data, for version lists. */
export const designVersionInfoSchema = z.object({
  id: z.string(),
  version: z.number().int().min(1),
  createdAt: z.string(),
  createdByName: z.string(),
  reason: z.string(),
  origin: designOriginSchema,
  approvalState: designApprovalStateSchema.optional(),
  /** The proposer's user id: the app offers approval only to someone else. */
  createdById: z.string().optional(),
  /** The version in force it was compared with when it was made (null: the first version). */
  basedOnVersion: z.number().int().nullable().optional(),
  decidedAt: z.string().nullable().optional(),
  decidedByName: z.string().nullable().optional(),
  decisionReason: z.string().nullable().optional(),
});
export type DesignVersionInfo = z.infer<typeof designVersionInfoSchema>;

/** One stored version of a ride's design data: who made it, when and why. Versions never change. */
export const designVersionSchema = designVersionInfoSchema.extend({ data: designDataSchema });
export type DesignVersion = z.infer<typeof designVersionSchema>;

/**
 * `GET /api/rides/:id`: the ride as lists show it, and its current design data. `design` is null when the
 * ride has no design data yet, and always null for operators (they may not see design data).
 */
export const rideDetailResponseSchema = z.object({
  ride: rideSummarySchema,
  design: designVersionSchema.nullable(),
});
export type RideDetailResponse = z.infer<typeof rideDetailResponseSchema>;

/** A reason for a change, kept with the version it makes. */
export const changeReasonSchema = requiredText(500);

/**
 * PUT /api/rides/:id/design: a new version. `basedOnVersion` (the version the editor started from) turns
 * a concurrent edit into a 409 instead of silently replacing someone else's version; 0 means "no design
 * data yet".
 */
export const designPutBodySchema = z.object({
  reason: changeReasonSchema,
  data: designDataSchema,
  basedOnVersion: z.number().int().min(0).optional(),
});
export type DesignPutBody = z.input<typeof designPutBodySchema>;

export const designResponseSchema = z.object({ design: designVersionSchema });

/**
 * `GET /api/rides/:id/design/pending` (admins and supervisors): the revision waiting for approval and the
 * version in force it would replace, so the comparison is drawn from both.
 */
export const designPendingResponseSchema = z.object({
  pending: designVersionSchema.nullable(),
  current: designVersionSchema.nullable(),
});

/** `POST /api/rides/:id/design/versions/:version/decision`: a second person approves or rejects, with why. */
export const designDecisionBodySchema = z.object({
  decision: z.enum(['approve', 'reject'], { error: 'approve or reject' }),
  reason: changeReasonSchema,
});
export type DesignDecisionBody = z.output<typeof designDecisionBodySchema>;
export const designVersionListResponseSchema = z.object({ versions: z.array(designVersionInfoSchema) });
export const designVersionParamsSchema = z.object({
  id: id(),
  version: z.coerce.number({ error: 'Must be a whole number' }).int('Must be a whole number').min(1),
});
