/**
 * A ride's pivot life as a notice carries it: frozen words, formatted once when the notice is issued, so
 * the app, the e-mail and the PDF print the same lines. Absent from notices issued before it existed.
 */
import { z } from 'zod';

export const noticePivotLifeSchema = z.object({
  /** The day the life was worked out for (YYYY-MM-DD). */
  asOf: z.string(),
  /** Where the damage rates come from and what the running log covers. */
  basis: z.string(),
  log: z.string(),
  /** Per pivot: life used and projected limit per detail, NDT due, wear projections flagged. */
  pivots: z.array(z.object({ name: z.string(), lines: z.array(z.string()) })),
  assumptions: z.array(z.string()),
  standards: z.array(z.string()),
});
export type NoticePivotLife = z.infer<typeof noticePivotLifeSchema>;
