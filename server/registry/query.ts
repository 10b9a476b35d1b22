import { asc, desc, sql, type AnyColumn, type SQL } from 'drizzle-orm';

/** `column LIKE '%term%'`, with the term's own % and _ taken literally. Case-insensitive for ASCII. */
export function contains(column: AnyColumn | SQL, term: string): SQL {
  const escaped = term.replace(/[\\%_]/g, (c) => `\\${c}`);
  return sql`${column} LIKE ${`%${escaped}%`} ESCAPE '\\'`;
}

/** ORDER BY for `?sort=key` / `?sort=-key`, then the tiebreakers, so pages never overlap or skip rows. */
export function orderBy<K extends string>(
  sort: K | `-${K}` | undefined,
  columns: Record<K, AnyColumn | SQL>,
  fallback: SQL[],
  tiebreakers: (AnyColumn | SQL)[],
): SQL[] {
  const ties = tiebreakers.map((c) => asc(c));
  if (!sort) return [...fallback, ...ties];
  const descending = sort.startsWith('-');
  const key = (descending ? sort.slice(1) : sort) as K;
  const column = columns[key];
  return [descending ? desc(column) : asc(column), ...ties];
}

type Paging = { page: number; pageSize: number };
export const offsetOf = ({ page, pageSize }: Paging) => (page - 1) * pageSize;
