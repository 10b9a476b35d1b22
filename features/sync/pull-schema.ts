/**
 * GET /api/sync/pull?cursor=… — what the server has changed for this inspector since `cursor` (no cursor:
 * everything). The device writes a whole answer, and the new cursor, in one transaction, so a cut
 * connection or a bad answer leaves the previous state and cursor untouched.
 */
import { z } from 'zod';

import { type ChecklistTemplate, checklistTemplateSchema } from '@/features/registry/schema';
import { designVersionSchema } from '@/features/registry/schema';
import { declarationSettingSchema, instrumentSchema } from '@/features/instruments/schema';
import { rideSummarySchema } from '@/features/rides/schema';
import { openBulletinSchema } from '@/features/bulletins/schema';

/**
 * A ride as the phone keeps it: its summary and the makers' bulletins still open on it, which the
 * inspector's checklist includes (absent from copies pulled before bulletins: none).
 */
export const pulledRideSchema = rideSummarySchema.extend({
  openBulletins: z.array(openBulletinSchema).optional(),
});
export type PulledRide = z.infer<typeof pulledRideSchema>;

/** A design-data version of one ride (immutable once made). */
export const pulledDesignSchema = designVersionSchema.extend({ rideId: z.string().min(1) });
export type PulledDesign = z.infer<typeof pulledDesignSchema>;

/** A checklist template with its current version's areas and items, as the register serves it. */
export const pulledTemplateSchema = checklistTemplateSchema;
export type PulledTemplate = ChecklistTemplate;

/** A ride the inspector is asked to inspect; the rest of the fields are kept as sent. */
export const pulledAssignmentSchema = z.looseObject({
  id: z.string().min(1),
  rideId: z.string().min(1),
});
export type PulledAssignment = z.infer<typeof pulledAssignmentSchema>;

/**
 * A finding the supervisor recorded on the inspection. `severity` is one of `findingSeverities` and
 * `state` one of `findingStates` (features/review/schema.ts), kept as plain strings so a value added by a
 * newer server is still stored and shown as sent.
 */
export const pulledDecisionFindingSchema = z.looseObject({
  id: z.string().optional(),
  number: z.number().int(),
  severity: z.string(),
  description: z.string(),
  requiredAction: z.string().nullable().optional(),
  /** YYYY-MM-DD. */
  dueOn: z.string().nullable().optional(),
  state: z.string().optional(),
});
export type PulledDecisionFinding = z.infer<typeof pulledDecisionFindingSchema>;

/**
 * A supervisor's decision on one of this inspector's submitted inspections, sent again whenever it or one
 * of its findings changes. Only the id is required; whatever else a server sends is kept.
 */
export const pulledDecisionSchema = z.looseObject({
  inspectionId: z.string().min(1),
  rideId: z.string().optional(),
  /** `approved` or `returned`. */
  state: z.string().optional(),
  /** The supervisor's comment; a returned inspection always has one. */
  note: z.string().nullable().optional(),
  decidedAt: z.string().optional(),
  decidedByName: z.string().nullable().optional(),
  /** In number order; absent from servers older than the review desk. */
  findings: z.array(pulledDecisionFindingSchema).optional(),
});
export type PulledDecision = z.infer<typeof pulledDecisionSchema>;

export const pullResponseSchema = z.object({
  /** Opaque to the device; sent back unchanged on the next pull. */
  cursor: z.string().min(1),
  rides: z.array(pulledRideSchema).optional(),
  designs: z.array(pulledDesignSchema).optional(),
  templates: z.array(pulledTemplateSchema).optional(),
  assignments: z.array(pulledAssignmentSchema).optional(),
  decisions: z.array(pulledDecisionSchema).optional(),
  /** The whole instrument register (retired ones included) when present: the phone replaces its copy. */
  instruments: z.array(instrumentSchema).optional(),
  /** The inspection body's declaration text, shown at submit. */
  declaration: declarationSettingSchema.optional(),
  /** Ids no longer meant for this inspector (an assignment withdrawn, a ride reassigned, a template archived). */
  removed: z
    .object({
      rides: z.array(z.string()).optional(),
      assignments: z.array(z.string()).optional(),
      templates: z.array(z.string()).optional(),
    })
    .optional(),
  /** True when the server cut the answer short: pull again with the new cursor. */
  hasMore: z.boolean().optional(),
});
export type PullResponse = z.infer<typeof pullResponseSchema>;
