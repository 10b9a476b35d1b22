/**
 * What the server requires of every record pushed now, beyond its shape: the inspector's declaration, and
 * no reading taken with an instrument past its calibration due date (by the register, and by the snapshot
 * the phone recorded, since the register may have been renewed since the reading was taken) or after the
 * instrument was retired. Records stored before these rules never pass through push again.
 */
import type Database from 'better-sqlite3';

import type { InspectionRecord } from '@/features/records/schema';
import { pastDueAt } from '@/features/instruments/schema';
import type { Db } from '@/server/db';
import { sqliteOf } from '@/server/sqlite-client';

type Issue = { path: string; message: string };
type RegisterRow = { calibrationDueOn: string | null; retiredAt: string | null };

const statements = new WeakMap<Database.Database, Database.Statement<[string], RegisterRow>>();

/** A lookup of register entries by id, with its prepared statement made once per connection. */
export function instrumentLookup(db: Db): (id: string) => RegisterRow | null {
  const sqlite = sqliteOf(db);
  let st = statements.get(sqlite);
  if (!st) {
    st = sqlite.prepare(
      'SELECT calibration_due_on AS calibrationDueOn, retired_at AS retiredAt FROM instruments WHERE id = ?',
    );
    statements.set(sqlite, st);
  }
  const found = new Map<string, RegisterRow | null>();
  return (id) => {
    if (!found.has(id)) found.set(id, st.get(id) ?? null);
    return found.get(id) ?? null;
  };
}

export function recordTruthIssues(
  record: InspectionRecord,
  lookup: (id: string) => RegisterRow | null,
): Issue[] {
  const issues: Issue[] = [];
  if (!record.declaration)
    issues.push({
      path: 'declaration',
      message: "Required: the inspector's declaration, made at submit, with who made it and when",
    });
  record.readings.forEach((r, i) => {
    if (!r.instrument) return;
    const path = `readings.${i}.instrument`;
    const registered = lookup(r.instrument.id);
    const name = `${r.instrument.name} (serial ${r.instrument.serial})`;
    const dueOn = [r.instrument.calibrationDueOn, registered?.calibrationDueOn ?? null]
      .filter((d): d is string => d !== null)
      .sort()[0];
    if (dueOn !== undefined && pastDueAt(dueOn, r.takenAt))
      issues.push({
        path,
        message: `Taken with ${name} after its calibration fell due on ${dueOn}; re-measure with a calibrated instrument`,
      });
    else if (registered?.retiredAt && registered.retiredAt <= new Date(r.takenAt).toISOString())
      issues.push({ path, message: `Taken with ${name} after it was retired from the register` });
  });
  return issues;
}
