/**
 * A notice to a ride's operator, as issued. `NoticeDocument` is the frozen content: built once when the
 * notice is issued, stored as JSON, and rendered unchanged to the app, the e-mail and the PDF, so what the
 * operator received can always be shown again exactly. Pure zod, no React.
 */
import { z } from 'zod';

import { pageSchema, pagingQuerySchema } from '@/lib/list-params';
import { findingSchema } from '@/features/notices/finding-schema';
import { noticePivotLifeSchema } from '@/features/pivot-life/notice-schema';
import { rideStatuses } from '@/features/rides/schema';
import {
  findingSeverities,
  findingStates,
  deliveryStatuses,
  envelopeStatuses,
  noticeDeliveryStates,
  noticeDeliveryStateVocabulary,
  noticeKinds,
  noticeUnitSystems,
  noticeUnitSystemVocabulary,
  paperSizes,
  type NoticeDeliveryState,
  type NoticeUnitSystem,
  type PaperSizeName,
  type NoticeKind,
} from '@/lib/vocabulary';

// Notice kinds and delivery states, with their words and marks, are defined in lib/vocabulary.
export { deliveryStatuses, noticeDeliveryStates, noticeKinds };
export type { NoticeDeliveryState, NoticeKind };

const envelopeStatus = z.enum(envelopeStatuses);

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
  /** The site's IANA zone when issued: times print on its clock, named. Absent on older notices (UTC). */
  timeZone: z.string().optional(),
  /**
   * The operator company's notice units and paper when issued: `results`, `loadSummary` are formatted in
   * these units, and the PDF is laid out on this paper (e-mail attachment and download). Absent on older
   * notices: SI on A4.
   */
  units: z.enum(noticeUnitSystems).optional(),
  paper: z.enum(paperSizes).optional(),
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
      /** The load case that governs the envelope ("Emergency stop"); absent from older notices. */
      governingCase: z.string().nullable().optional(),
    })
    .nullable(),
  /** Readings and computed values against their design limits, formatted with units (`units`). */
  results: z.array(
    z.object({
      label: z.string(),
      value: z.string(),
      limit: z.string(),
      ratio: z.number().nullable(),
      status: envelopeStatus,
      /**
       * What `value` was formatted from (lib/measured-format.ts): the SI value, its quantity, and for a
       * measured value the text typed and its unit. Absent from notices issued before it was kept.
       */
      measured: z
        .object({
          valueSI: z.number(),
          quantity: z.string(),
          entered: z.string().nullable(),
          unit: z.string().nullable(),
        })
        .optional(),
    }),
  ),
  /** Peak pivot loads of the ride cycle (formatted in `units`), with the pivot's limit where the design has one. */
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
  /**
   * The ride's pivot life when the notice was issued (fatigue life used and projected limit dates, NDT due
   * dates, flagged wear projections), in words; absent from notices issued before it was kept.
   */
  pivotLife: noticePivotLifeSchema.nullable().optional(),
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

/** The units a notice's figures are in: as frozen when issued, SI for notices from before the choice. */
export const noticeUnitsOf = (doc: Pick<NoticeDocument, 'units'>): NoticeUnitSystem => doc.units ?? 'si';
/** The one sentence the view, the e-mail and the PDF print about a notice's units. */
export function noticeUnitsText(doc: Pick<NoticeDocument, 'units'>): string {
  const words = noticeUnitSystemVocabulary[noticeUnitsOf(doc)];
  return `Figures in ${words.label} units (${words.description}).`;
}
/** The paper a notice's PDF is laid out on: as frozen when issued, A4 for notices from before the choice. */
export const noticePaperOf = (doc: Pick<NoticeDocument, 'paper'>): PaperSizeName => doc.paper ?? 'A4';

// ——— the API around notices ———

/** Where a notice's e-mail stands over all its recipients (`noticeDeliveryStates`): its words. */
export const noticeDeliveryStateInfo = noticeDeliveryStateVocabulary;

const noticeDeliverySummarySchema = z.object({
  state: z.enum(noticeDeliveryStates),
  total: z.number().int(),
  sent: z.number().int(),
  failed: z.number().int(),
});

/** `GET /api/notices`: operators get their own company's only, whatever the filters say. */
export const noticeListQuerySchema = pagingQuerySchema.extend({
  pageSize: z.coerce
    .number({ error: 'Must be a whole number' })
    .int('Must be a whole number')
    .min(1)
    .max(100, 'At most 100')
    .default(25),
  rideId: z.string().trim().min(1).max(64).optional(),
  operatorId: z.string().trim().min(1).max(64).optional(),
});
export type NoticeListQuery = z.output<typeof noticeListQuerySchema>;

const noticeHeadFields = {
  id: z.string(),
  reference: z.string(),
  kind: z.enum(noticeKinds),
  inspectionId: z.string().nullable(),
  rideId: z.string(),
  rideName: z.string(),
  operatorId: z.string(),
  operatorName: z.string(),
  issuedAt: z.string(),
  issuedByName: z.string().nullable(),
  acknowledgedAt: z.string().nullable(),
  acknowledgedByName: z.string().nullable(),
  delivery: noticeDeliverySummarySchema,
  /** The notice's findings not yet closed, as they stand now. */
  openFindings: z.number().int(),
  findingsTotal: z.number().int(),
};

export const noticeListItemSchema = z.object(noticeHeadFields);
export type NoticeListItem = z.infer<typeof noticeListItemSchema>;
export const noticeListResponseSchema = pageSchema.extend({ notices: z.array(noticeListItemSchema) });
export type NoticeListResponse = z.infer<typeof noticeListResponseSchema>;

const noticeDeliverySchema = z.object({
  id: z.string(),
  recipient: z.string(),
  status: z.enum(deliveryStatuses),
  attempts: z.number().int(),
  /** When the next try is due, while one is. */
  nextAttemptAt: z.string().nullable(),
  /** Why the last try failed (staff only; null for operators). */
  lastError: z.string().nullable(),
  sentAt: z.string().nullable(),
});

export const correctiveActionSchema = z.object({
  id: z.string(),
  findingId: z.string(),
  note: z.string(),
  photoShas: z.array(z.string()),
  reportedAt: z.string(),
  reportedByName: z.string().nullable(),
});
export type CorrectiveAction = z.infer<typeof correctiveActionSchema>;

/** A notice's finding as it stands now (the document keeps it as issued), with the operator's actions. */
export const noticeFindingSchema = findingSchema.extend({
  correctiveActions: z.array(correctiveActionSchema),
});
export type NoticeFinding = z.infer<typeof noticeFindingSchema>;

/** `GET /api/notices/:id` and the answer to acknowledging. */
export const noticeDetailSchema = z.object({
  ...noticeHeadFields,
  document: noticeDocumentSchema,
  deliveries: z.array(noticeDeliverySchema),
  findings: z.array(noticeFindingSchema),
});
export type NoticeDetail = z.infer<typeof noticeDetailSchema>;
export const noticeResponseSchema = z.object({ notice: noticeDetailSchema });

const photoSha = z.string().regex(/^[0-9a-f]{64}$/, 'Must be a photo reference (64 hex digits)');
/** Evidence photos, uploaded beforehand and named by their SHA-256: at most 12, each counted once. */
export const evidencePhotos = z
  .array(photoSha)
  .max(12, 'At most 12 photos')
  .default([])
  .transform((v) => [...new Set(v)]);
/** A note the finding's next step needs; `ask` is what the form says when it is left empty. */
const requiredNote = (ask: string) =>
  z.string({ error: 'Required' }).trim().min(1, ask).max(2000, 'At most 2000 characters');

/** `POST /api/findings/:id/actions`: what the operator did, with evidence photos uploaded beforehand. */
export const correctiveActionInputSchema = z.object({
  note: requiredNote('Say what was done'),
  photoShas: evidencePhotos,
});
export type CorrectiveActionInput = z.input<typeof correctiveActionInputSchema>;

/**
 * `POST /api/findings/:id/close`: the verifier's note is required, and so is evidence of the correction —
 * photos taken at the verification (uploaded first), a document reference (work order, NDT or maker's
 * report), or, without either, the operator's corrective-action report already on record (the server
 * checks that last one and answers 400 naming `evidence` when there is none).
 */
export const findingCloseInputSchema = z.object({
  note: requiredNote('Say what you checked and found'),
  photoShas: evidencePhotos,
  evidenceRef: z
    .string()
    .trim()
    .max(300, 'At most 300 characters')
    .nullish()
    .transform((v) => (v ? v : null)),
});
export type FindingCloseInput = z.input<typeof findingCloseInputSchema>;

/** `POST /api/findings/:id/reopen`: the comment says what is still wrong, and is required. */
export const findingReopenInputSchema = z.object({
  note: requiredNote('Say why the finding is reopened'),
});
export type FindingReopenInput = z.input<typeof findingReopenInputSchema>;

/**
 * The answer to reporting an action, closing or reopening: the finding now, the ride's status now, and
 * the status notice issued when the ride's status followed.
 */
export const findingStateResponseSchema = z.object({
  finding: noticeFindingSchema,
  ride: z.object({ id: z.string(), status: z.enum(rideStatuses), statusReason: z.string().nullable() }),
  statusNotice: z.object({ id: z.string(), reference: z.string() }).nullable(),
});
export type FindingStateResponse = z.infer<typeof findingStateResponseSchema>;

// ——— the admin's view of the local mailbox ———

const outboxAttachmentSchema = z.object({
  index: z.number().int(),
  filename: z.string().nullable(),
  contentType: z.string(),
  size: z.number().int(),
});
export const outboxMessageSchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  messageId: z.string().nullable(),
  idempotencyKey: z.string().nullable(),
  size: z.number().int(),
  attachments: z.array(outboxAttachmentSchema),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
/** `GET /api/admin/outbox`: newest first. */
export const outboxListResponseSchema = z.object({ messages: z.array(outboxMessageSchema) });
/** `GET /api/admin/outbox/:id`: one message with its text and html bodies. */
export const outboxMessageResponseSchema = z.object({
  message: outboxMessageSchema.extend({ text: z.string().nullable(), html: z.string().nullable() }),
});
