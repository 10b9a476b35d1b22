/**
 * The server's half of the plausibility rule (features/inspections/plausibility.ts): a new record whose
 * motion reading is far from the design motion it is analysed against must carry the inspector's
 * confirmation, or it is refused with an issue naming the reading's value — the phone asks before it
 * lets such a reading count, so only an old or altered app sends one unconfirmed.
 */
import type Database from 'better-sqlite3';

import { plausibilityText, unconfirmedImplausible } from '@/features/records/plausibility';
import type { Reading } from '@/features/records/schema';
import { type DesignData, designDataSchema } from '@/features/loads/design-schema';

type Issue = { path: string; message: string };

type ParsedDesign = { text: string; design: DesignData | null };

/** The design-data statement, prepared once per connection. */
const designStatements = new WeakMap<Database.Database, Database.Statement<[string], { data: string }>>();

/**
 * Parsed design versions by id, kept for the process: a push re-reads the same few designs batch after
 * batch, and a new connection (a restart of the server's, a test's or a bench's database) names the same
 * versions again. A parse is reused only for the very text it was made from, so it is the same answer
 * whichever connection read that text.
 */
const parsed = new Map<string, ParsedDesign>();
/** Enough for every version a busy day's pushes name; past it the cache starts again rather than grow. */
const DESIGN_CACHE_SIZE = 256;

function designStatementOf(sqlite: Database.Database) {
  let stmt = designStatements.get(sqlite);
  if (!stmt) {
    stmt = sqlite.prepare<[string], { data: string }>('SELECT data FROM design_versions WHERE id = ?');
    designStatements.set(sqlite, stmt);
  }
  return stmt;
}

/**
 * Design data by version id, read once per batch; null for an id with no (readable) data. Checking the
 * design schema costs more than storing a record, so a version's text is parsed once and the parse reused
 * while the stored text is the same (the text is re-read every batch, so nothing stale is ever used).
 */
export function designDataLookup(sqlite: Database.Database): (id: string) => DesignData | null {
  const stmt = designStatementOf(sqlite);
  const seen = new Map<string, DesignData | null>();
  return (id) => {
    let design = seen.get(id);
    if (design === undefined) {
      const row = stmt.get(id);
      const kept = parsed.get(id);
      if (!row) design = null;
      else if (kept && kept.text === row.data) design = kept.design;
      else {
        const result = designDataSchema.safeParse(JSON.parse(row.data));
        design = result.success ? result.data : null;
        if (parsed.size >= DESIGN_CACHE_SIZE) parsed.clear();
        parsed.set(id, { text: row.data, design });
      }
      seen.set(id, design);
    }
    return design;
  };
}

const readingsStatements = new WeakMap<
  Database.Database,
  Database.Statement<[string], { readings: string | null }>
>();

/**
 * The readings of an accepted inspection, by its id (empty when there is none): an amendment may carry
 * them over unchanged, and what was accepted once is not asked again.
 */
export function acceptedReadingsLookup(sqlite: Database.Database): (id: string) => readonly Reading[] {
  let stmt = readingsStatements.get(sqlite);
  if (!stmt) {
    stmt = sqlite.prepare<[string], { readings: string | null }>(
      "SELECT json_extract(record, '$.readings') AS readings FROM inspections WHERE id = ?",
    );
    readingsStatements.set(sqlite, stmt);
  }
  const st = stmt;
  return (id) => {
    const row = st.get(id);
    const list: unknown = row?.readings ? JSON.parse(row.readings) : [];
    return Array.isArray(list) ? (list as Reading[]) : [];
  };
}

/**
 * Issues for each reading far from the design motion without a confirmation. `carried` are the readings
 * of the inspection an amendment corrects: one of them carried over unchanged (same id and value) was
 * accepted before, perhaps before this rule existed, and a correction must not be refused for it.
 */
export function plausibilityIssues(
  design: DesignData | null,
  readings: readonly Reading[],
  carried: readonly Pick<Reading, 'id' | 'valueSI'>[] = [],
): Issue[] {
  if (!design) return [];
  const before = new Set(carried.map((r) => `${r.id}:${r.valueSI}`));
  const unconfirmed = unconfirmedImplausible(design, readings);
  return unconfirmed
    .filter(({ reading }) => !before.has(`${reading.id}:${reading.valueSI}`))
    .map(({ index, check }) => ({
      path: `readings.${index}.valueSI`,
      message:
        `Far from the design motion: ${plausibilityText(check)}. The inspector must confirm this value on the ` +
        'phone, or measure again, before it can be accepted',
    }));
}
