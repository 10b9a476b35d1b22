/**
 * A notice to a ride's operator, as issued. `NoticeDocument` is the frozen content: built once when the
 * notice is issued, stored as JSON, and rendered unchanged to the app, the e-mail and the PDF, so what the
 * operator received can always be shown again exactly. Pure zod, no React.
 */
import { z } from 'zod';

import { findingSeverities, findingStates } from '@/features/review/schema';
import { rideStatuses } from '@/features/rides/schema';

export const noticeKinds = ['inspection', 'status_change'] as const;
export type NoticeKind = (typeof noticeKinds)[number];

const envelopeStatus = z.enum(['within', 'near', 'over']);

export const noticeDocumentSchema = z.object({
  /** Human reference printed on the notice, e.g. "PW-2026-0007". */
  reference: z.string(),
  kind: z.enum(noticeKinds),
  issuedAt: z.string(),
  /** The inspection body issuing the notice. */
  issuer: z.object({ name: z.string(), address: z.string().nullable(), phone: z.string().nullable() }),
  operator: z.object({ id: z.string(), name: z.string(), address: z.string().nullable() }),
  ride: z.object({
    id: z.string(),
    name: z.string(),
    rideClass: z.string(),
    maker: z.string().nullable(),
    model: z.string().nullable(),
    serial: z.string().nullable(),
    year: z.number().int().nullable(),
  }),
  site: z.object({ name: z.string(), address: z.string().nullable() }).nullable(),
  /** Null for a notice of a status change made outside an inspection. */
  inspection: z
    .object({
      id: z.string(),
      type: z.string(),
      /** Human words for the type, e.g. "Periodic inspection". */
      typeLabel: z.string(),
      date: z.string(),
      inspectorName: z.string(),
      /** The inspector's credential or registration, when the register holds one. */
      inspectorCredential: z.string().nullable(),
      designVersion: z.number().int().nullable(),
      engineVersion: z.string().nullable(),
    })
    .nullable(),
  /** Readings and computed values against their design limits, formatted with units (SI). */
  results: z.array(
    z.object({
      label: z.string(),
      value: z.string(),
      limit: z.string(),
      ratio: z.number().nullable(),
      status: envelopeStatus,
    }),
  ),
  /** Peak pivot loads of the ride cycle (SI, formatted), with the pivot's limit where the design has one. */
  loadSummary: z.array(z.object({ pivot: z.string(), peakForce: z.string(), limit: z.string().nullable() })),
  checklist: z.object({ total: z.number().int(), failed: z.number().int() }).nullable(),
  findings: z.array(
    z.object({
      id: z.string(),
      number: z.number().int(),
      severity: z.enum(findingSeverities),
      description: z.string(),
      ruleRef: z.string().nullable(),
      requiredAction: z.string().nullable(),
      dueOn: z.string().nullable(),
      state: z.enum(findingStates),
      /** Photos referenced by the finding, included as thumbnails in the PDF. */
      photos: z.array(z.object({ sha256: z.string(), caption: z.string() })),
    }),
  ),
  operatingStatus: z.object({ status: z.enum(rideStatuses), reason: z.string().nullable() }),
  reinspection: z.object({ required: z.boolean(), reason: z.string().nullable() }),
  /** The supervisor's comment on the decision, if any. */
  note: z.string().nullable(),
  /** How the operator can disagree with the notice, in our words. */
  appeal: z.string(),
  caution: z.string(),
  signature: z.object({ name: z.string(), role: z.string(), signedAt: z.string() }),
  /** The notice in the app. */
  url: z.string(),
});
export type NoticeDocument = z.infer<typeof noticeDocumentSchema>;
