/**
 * The incident report's contract, shared by the operator's form, the API client and the server: what the
 * operator sends (`incidentInputSchema`), what the server answers, and the supervisor's review.
 *
 * Times are typed on the site's clock as "YYYY-MM-DDTHH:MM" (the ride's site zone, as every date at a ride);
 * the server turns them into instants with that zone and answers instants with the zone beside them.
 */
import { z } from 'zod';

import { evidencePhotos } from '@/features/notices/schema';
import { incidentKinds, incidentKindVocabulary, rideStatuses, type IncidentKind } from '@/lib/vocabulary';

export { incidentKinds, incidentKindVocabulary };
export type { IncidentKind };

const LOCAL_STAMP = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/;

/** A real calendar date and a time of day, as typed on the site's clock. */
const localStamp = (ask: string) =>
  z
    .string({ error: ask })
    .regex(LOCAL_STAMP, 'A date and a time (HH:MM, 24-hour clock)')
    .refine((v) => {
      const [, y, m, d, hh, mm] = LOCAL_STAMP.exec(v)!.map(Number);
      const date = new Date(Date.UTC(y, m - 1, d));
      return date.getUTCMonth() === m - 1 && date.getUTCDate() === d && hh < 24 && mm < 60;
    }, 'Not a real date and time');

/** The longest account of what happened. */
export const INCIDENT_TEXT_MAX = 4000;

/**
 * `POST /api/rides/:id/incidents`. `stopRide` takes the ride out of service with the report and asks the
 * inspection body for the follow-up inspection; a ride so stopped is not back running, so it takes no
 * `runningAgainAt`.
 */
export const incidentInputSchema = z
  .object({
    kind: z.enum(incidentKinds, {
      error: 'Choose what happened: injury or damage, near miss, or unplanned stop',
    }),
    occurredAt: localStamp('Say when it happened'),
    what: z
      .string({ error: 'Say what happened' })
      .trim()
      .min(1, 'Say what happened')
      .max(INCIDENT_TEXT_MAX, `At most ${INCIDENT_TEXT_MAX} characters`),
    ridersAffected: z
      .int({ error: 'A whole number of riders (0 if none)' })
      .min(0, 'Cannot be negative')
      .max(10_000, 'At most 10000'),
    anyoneHurt: z.boolean({ error: 'Say whether anyone was hurt' }),
    stoppedAt: localStamp('When did the ride stop?').optional(),
    runningAgainAt: localStamp('When did it run again?').optional(),
    photoShas: evidencePhotos,
    stopRide: z.boolean().default(false),
  })
  .superRefine((v, ctx) => {
    // Stamps of one zone compare as text.
    if (v.stoppedAt && v.runningAgainAt && v.runningAgainAt < v.stoppedAt)
      ctx.addIssue({
        code: 'custom',
        path: ['runningAgainAt'],
        message: 'Cannot be before the ride stopped',
      });
    if (v.runningAgainAt && !v.stoppedAt)
      ctx.addIssue({ code: 'custom', path: ['stoppedAt'], message: 'Say when the ride stopped too' });
    if (v.stopRide && v.runningAgainAt)
      ctx.addIssue({
        code: 'custom',
        path: ['runningAgainAt'],
        message: 'A ride you take out of service is not running again; leave this empty',
      });
  });
export type IncidentInput = z.input<typeof incidentInputSchema>;
export type IncidentInputParsed = z.output<typeof incidentInputSchema>;

/** `POST /api/incidents/:id/review`: the supervisor's note closing the report. */
export const incidentReviewInputSchema = z.object({
  note: z
    .string({ error: 'Required' })
    .trim()
    .min(1, 'Say what was checked or decided')
    .max(2000, 'At most 2000 characters'),
});
export type IncidentReviewInput = z.input<typeof incidentReviewInputSchema>;

export const incidentSchema = z.object({
  id: z.string(),
  rideId: z.string(),
  rideName: z.string(),
  kind: z.enum(incidentKinds),
  /** Instants (ISO UTC); shown on `timeZone`, the site's clock they were typed on. */
  occurredAt: z.string(),
  timeZone: z.string(),
  what: z.string(),
  ridersAffected: z.number().int(),
  anyoneHurt: z.boolean(),
  stoppedAt: z.string().nullable(),
  runningAgainAt: z.string().nullable(),
  photoShas: z.array(z.string()),
  /** The report took the ride out of service (and asked for the follow-up inspection). */
  stoppedRide: z.boolean(),
  reportedBy: z.string(),
  reportedByName: z.string(),
  reportedAt: z.string(),
  reviewedAt: z.string().nullable(),
  reviewedByName: z.string().nullable(),
  reviewNote: z.string().nullable(),
});
export type Incident = z.infer<typeof incidentSchema>;

/** `GET /api/rides/:id/incidents`: the ride's reports, newest first. */
export const rideIncidentsResponseSchema = z.object({
  rideId: z.string(),
  rideName: z.string(),
  rideStatus: z.enum(rideStatuses),
  /** The site's zone: the clock the form's times are typed on. */
  timeZone: z.string(),
  incidents: z.array(incidentSchema),
});
export type RideIncidentsResponse = z.infer<typeof rideIncidentsResponseSchema>;

/** `POST /api/rides/:id/incidents`: the stored report, and the ride's status after it. */
export const incidentCreatedSchema = z.object({
  incident: incidentSchema,
  rideStatus: z.enum(rideStatuses),
  /** The follow-up inspection was booked (the ride was stopped with the report). */
  followUpBooked: z.boolean(),
});
export type IncidentCreated = z.infer<typeof incidentCreatedSchema>;

/** An open report is serious when it stopped the ride or someone was hurt: it goes to the top of the queue. */
export const isSeriousIncident = (i: Pick<Incident, 'stoppedRide' | 'anyoneHurt'>) =>
  i.stoppedRide || i.anyoneHurt;

/** The first line of what happened, cut to a list's width: the report's summary in lists and logbooks. */
export function incidentSummary(what: string, max = 120): string {
  const line = what.trim().split(/\r?\n/)[0] ?? '';
  return line.length > max ? `${line.slice(0, max - 1).trimEnd()}…` : line;
}
