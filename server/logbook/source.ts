/**
 * What a logbook source is: one function that reads one kind of entry of one ride, with the viewer's
 * scope and the date range pushed down into its SQL. Sources are listed in `sources.ts`; the route merges
 * what they return (features/logbook/merge.ts).
 */
import { sql, type SQL, type SQLWrapper } from 'drizzle-orm';

import type { LogbookEvent, LogbookKind } from '@/features/logbook/schema';
import type { SessionUser } from '@/features/session/schema';
import { dayInZone } from '@/lib/dates';
import type { Db } from '@/server/db';

export type Reader = Pick<Db, 'select'>;

/** What every source is asked: whose logbook, for whom, over which instants. */
export type SourceQuery = {
  rideId: string;
  /** The ride's site zone: an entry's `day` is its date on this clock. */
  zone: string;
  viewer: SessionUser;
  /** Inclusive lower and exclusive upper bound, ISO instants in UTC; absent = open. */
  fromAt?: string;
  beforeAt?: string;
};

export type LogbookSource = {
  kind: LogbookKind;
  /** Whether this viewer may see entries of this kind at all; `read` narrows further where it must. */
  shownTo: (viewer: SessionUser) => boolean;
  read: (db: Reader, q: SourceQuery) => LogbookEvent[];
};

export const isOperator = (v: SessionUser) => v.role === 'operator';
export const isDecider = (v: SessionUser) => v.role === 'supervisor' || v.role === 'admin';
export const staffOnly = (v: SessionUser) => !isOperator(v);
export const everyone = () => true;

/** An instant in the canonical UTC form, for one stored as the phone sent it (possibly with an offset). */
export const utcSql = (column: SQLWrapper) => sql<string>`strftime('%Y-%m-%dT%H:%M:%fZ', ${column})`;

/** `column` inside the query's range (normalised to UTC first, so a phone's offset cannot misplace it). */
export function inRange(column: SQLWrapper, q: SourceQuery): SQL {
  const at = utcSql(column);
  const parts: SQL[] = [sql`${column} IS NOT NULL`];
  if (q.fromAt) parts.push(sql`${at} >= ${q.fromAt}`);
  if (q.beforeAt) parts.push(sql`${at} < ${q.beforeAt}`);
  return sql.join(parts, sql` AND `);
}

/** The common part of an entry: its instant in UTC and the site day it fell on. */
export function when(at: string, zone: string): { at: string; day: string } {
  const iso = new Date(at).toISOString();
  return { at: iso, day: dayInZone(iso, zone) };
}

export const lines = (...items: (string | null | undefined | false)[]): string[] =>
  items.filter((s): s is string => typeof s === 'string' && s.trim() !== '');

/** A file name for a document from its title ("Certificate of conformity" → `Certificate-of-conformity.pdf`). */
export const pdfFileName = (title: string) =>
  `${title.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'document'}.pdf`;
