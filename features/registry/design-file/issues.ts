import { z } from 'zod';

import type { DesignData } from '@/features/loads/design-schema';

/** One problem in an imported file. `row` and `column` are set when the problem has a place in a CSV. */
export type ImportIssue = { row: number | null; column: string | null; path: string; message: string };

export type ImportResult = { ok: true; data: DesignData } | { ok: false; issues: ImportIssue[] };

/** How a place in a CSV is named in an issue's path: "row 4, mass_kg" or "row 4". */
export const cellPath = (row: number, column: string | null) =>
  column ? `row ${row}, ${column}` : `row ${row}`;

/** Problems in file order; those of the whole file last. */
export function sortIssues(issues: ImportIssue[]): ImportIssue[] {
  return [...issues].sort((a, b) => (a.row ?? Infinity) - (b.row ?? Infinity));
}

/** The 400 body of a rejected import: the API error shape, its issues carrying row and column. */
export const importIssueSchema = z.object({
  row: z.number().int().nullable(),
  column: z.string().nullable(),
  path: z.string(),
  message: z.string(),
});
export const importErrorSchema = z.object({
  error: z.object({
    code: z.literal('import_invalid'),
    message: z.string(),
    issues: z.array(importIssueSchema),
  }),
});
