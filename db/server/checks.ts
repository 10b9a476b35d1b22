/**
 * Helpers for CHECK constraints, shared by every server table. CHECK expressions name columns without
 * their table: drizzle-kit rebuilds a SQLite table under a temporary name when a later migration alters
 * it, and a table-qualified column would no longer resolve there.
 */
import { sql } from 'drizzle-orm';

export const col = (column: { name: string }) => sql.identifier(column.name);

/** `col IN ('a','b')` for a CHECK; the values are our own constants, never user input. */
export const oneOf = (column: { name: string }, values: readonly string[]) =>
  sql`${col(column)} IN (${sql.raw(values.map((v) => `'${v}'`).join(', '))})`;
