/**
 * The ride logbook's contract: one event of a ride's history as the server lists it (whatever its source:
 * an inspection, a decision, a finding, a notice…), the query that filters the list, and one page of it.
 * The server writes every word of an event (title, detail lines, who), so the page, the CSV and the PDF
 * say the same thing.
 */
import { z } from 'zod';

import { listOf } from '@/features/registry/schema/rides';
import { isRealIsoDay } from '@/lib/dates';

/**
 * Kinds of entry, in the order the filter chips show them. A new source adds its kind here (and its
 * words below); `server/logbook/sources.ts` says which source makes which kind.
 */
export const logbookKinds = [
  'inspection',
  'decision',
  'finding',
  'corrective_action',
  'notice',
  'ndt',
  'design',
  'status',
  'incident',
  'part',
  'setup',
  'daily_check',
  'bulletin',
] as const;
export type LogbookKind = (typeof logbookKinds)[number];

export const logbookKindWords: Record<LogbookKind, { label: string; chip: string }> = {
  inspection: { label: 'Inspection', chip: 'Inspections' },
  decision: { label: 'Review decision', chip: 'Decisions' },
  finding: { label: 'Finding', chip: 'Findings' },
  corrective_action: { label: 'Corrective action', chip: 'Corrective actions' },
  notice: { label: 'Notice', chip: 'Notices' },
  ndt: { label: 'NDT', chip: 'NDT' },
  design: { label: 'Design data', chip: 'Design data' },
  status: { label: 'Ride status', chip: 'Status' },
  incident: { label: 'Incident report', chip: 'Incidents' },
  part: { label: 'Part replaced', chip: 'Parts' },
  setup: { label: 'Set-up', chip: 'Set-ups' },
  daily_check: { label: 'Daily check', chip: 'Daily checks' },
  bulletin: { label: 'Maker’s bulletin', chip: 'Bulletins' },
};

/** A site day; years far outside any ride's life are refused rather than turned into instants. */
const day = () =>
  z
    .string()
    .trim()
    .refine((v) => isRealIsoDay(v), { message: 'Must be a real date as YYYY-MM-DD, e.g. 2026-05-01' })
    .refine((v) => v >= '1900-01-01' && v <= '2999-12-31', { message: 'Must be between 1900 and 2999' });

/** A page of the app an entry opens (an app path such as `/notices/…`). */
export const logbookLinkSchema = z.object({ label: z.string(), href: z.string().startsWith('/') });
export type LogbookLink = z.infer<typeof logbookLinkSchema>;

/** A file that goes with an entry, fetched from the API with the session (`/api/…`). */
export const logbookDocumentSchema = z.object({
  label: z.string(),
  apiPath: z.string().startsWith('/api/'),
  fileName: z.string(),
});
export type LogbookDocument = z.infer<typeof logbookDocumentSchema>;

export const logbookEventSchema = z.object({
  /** Unique within the ride's logbook: the source's kind and its row, e.g. `notice-ack:<id>`. */
  id: z.string(),
  rideId: z.string(),
  /** When it happened, as an ISO instant in UTC. */
  at: z.string(),
  /** The day it happened on the site's clock (YYYY-MM-DD): what the date filter compares. */
  day: z.string(),
  kind: z.enum(logbookKinds),
  title: z.string(),
  detail: z.array(z.string()),
  /** Who did it (a person's name, or the technician for NDT); null when nobody is recorded. */
  who: z.string().nullable(),
  link: logbookLinkSchema.nullable(),
  documents: z.array(logbookDocumentSchema),
});
export type LogbookEvent = z.infer<typeof logbookEventSchema>;

export const LOGBOOK_PAGE_SIZE = 25;
const Q_MAX = 100;

const filterShape = {
  kinds: listOf(logbookKinds).optional(),
  from: day().optional(),
  to: day().optional(),
  q: z
    .string()
    .trim()
    .max(Q_MAX, `At most ${Q_MAX} characters`)
    .optional()
    .transform((v) => (v ? v : undefined)),
};
const fromNotAfterTo = (v: { from?: string; to?: string }) => !v.from || !v.to || v.from <= v.to;
const rangeIssue = { path: ['to'], message: 'Must not be before From' };

/**
 * `GET /api/rides/:id/logbook?kinds=&from=&to=&q=&page=`: kinds comma separated (none = all), from/to
 * inclusive site days, q words that must all appear in the entry (title, detail, who; case ignored).
 */
export const logbookQuerySchema = z
  .object({
    ...filterShape,
    page: z.coerce
      .number({ error: 'Must be a whole number' })
      .int('Must be a whole number')
      .min(1)
      .default(1),
  })
  .refine(fromNotAfterTo, rangeIssue);
/** The exports (`logbook.csv`, `logbook.pdf`): the same filter, every entry; the PDF's paper size. */
export const logbookExportQuerySchema = z
  .object({ ...filterShape, size: z.enum(['A4', 'LETTER'], { error: 'A4 or LETTER' }).optional() })
  .refine(fromNotAfterTo, rangeIssue);
export type LogbookQuery = z.output<typeof logbookQuerySchema>;
/** The filter alone (paging apart): what the exports take. */
export type LogbookFilter = Omit<LogbookQuery, 'page'>;

export const logbookRideSchema = z.object({
  id: z.string(),
  name: z.string(),
  siteName: z.string().nullable(),
  operatorName: z.string(),
  timeZone: z.string(),
});
export type LogbookRide = z.infer<typeof logbookRideSchema>;

export const logbookPageSchema = z.object({
  ride: logbookRideSchema,
  events: z.array(logbookEventSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type LogbookPage = z.infer<typeof logbookPageSchema>;
