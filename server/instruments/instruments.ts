/**
 * The instrument register and the inspection body's declaration text: admin changes with an audit entry in
 * the same transaction, reads for staff and for the phone's pull.
 */
import { asc, eq } from 'drizzle-orm';

import { instruments, settings, type InstrumentRow } from '@/db/server/instruments';
import { users } from '@/db/server/schema';
import {
  DEFAULT_DECLARATION_TEXT,
  type DeclarationSetting,
  type Instrument,
  type InstrumentInput,
  type InstrumentPatch,
} from '@/features/instruments/schema';
import type { Db } from '@/server/db';
import { HttpError, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';

type Reader = Pick<Db, 'select'>;

const toInstrument = ({ ...row }: InstrumentRow): Instrument => row;

export function listInstruments(db: Reader): Instrument[] {
  return db
    .select()
    .from(instruments)
    .orderBy(asc(instruments.name), asc(instruments.serial), asc(instruments.id))
    .all()
    .map(toInstrument);
}

export function findInstrument(db: Reader, id: string): Instrument | null {
  const row = db.select().from(instruments).where(eq(instruments.id, id)).get();
  return row ? toInstrument(row) : null;
}

function mustFind(db: Reader, id: string): Instrument {
  const found = findInstrument(db, id);
  if (!found) throw notFound('No such instrument.');
  return found;
}

const label = (i: Pick<Instrument, 'name' | 'serial'>) => `${i.name} (serial ${i.serial})`;

export function createInstrument(
  db: Db,
  userId: string,
  input: InstrumentInput,
  now = new Date(),
): Instrument {
  return db.transaction((tx) => {
    const at = now.toISOString();
    const { id } = tx
      .insert(instruments)
      .values({
        name: input.name,
        serial: input.serial,
        method: input.method,
        kinds: input.kinds,
        calibratedOn: input.calibratedOn,
        calibrationDueOn: input.calibrationDueOn,
        notes: input.notes,
        retiredAt: input.retired ? at : null,
        createdAt: at,
        updatedAt: at,
      })
      .returning({ id: instruments.id })
      .get();
    const after = mustFind(tx, id);
    recordAudit(tx, {
      userId,
      entity: 'instrument',
      entityId: id,
      action: 'create',
      summary: `Instrument ${label(after)} added, calibration due ${after.calibrationDueOn ?? 'not set'}`,
      after,
    });
    return after;
  });
}

export function updateInstrument(
  db: Db,
  userId: string,
  id: string,
  patch: InstrumentPatch,
  now = new Date(),
): Instrument {
  return db.transaction((tx) => {
    const before = mustFind(tx, id);
    const calibratedOn = patch.calibratedOn !== undefined ? patch.calibratedOn : before.calibratedOn;
    const dueOn = patch.calibrationDueOn !== undefined ? patch.calibrationDueOn : before.calibrationDueOn;
    // The patch alone may be in order while the result is not (only one of the two dates sent).
    if (calibratedOn && dueOn && dueOn < calibratedOn)
      throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
        { path: 'calibrationDueOn', message: 'Must not be before the calibration date' },
      ]);
    const at = now.toISOString();
    tx.update(instruments)
      .set({
        ...(patch.name !== undefined && { name: patch.name }),
        ...(patch.serial !== undefined && { serial: patch.serial }),
        ...(patch.method !== undefined && { method: patch.method }),
        ...(patch.kinds !== undefined && { kinds: patch.kinds }),
        ...(patch.calibratedOn !== undefined && { calibratedOn: patch.calibratedOn }),
        ...(patch.calibrationDueOn !== undefined && { calibrationDueOn: patch.calibrationDueOn }),
        ...(patch.notes !== undefined && { notes: patch.notes }),
        ...(patch.retired !== undefined && {
          retiredAt: patch.retired ? (before.retiredAt ?? at) : null,
        }),
        updatedAt: at,
      })
      .where(eq(instruments.id, id))
      .run();
    const after = mustFind(tx, id);
    const words = [
      before.calibrationDueOn !== after.calibrationDueOn
        ? `calibration due ${before.calibrationDueOn ?? 'not set'} → ${after.calibrationDueOn ?? 'not set'}`
        : null,
      before.retiredAt === null && after.retiredAt !== null ? 'retired' : null,
      before.retiredAt !== null && after.retiredAt === null ? 'back in use' : null,
    ].filter(Boolean);
    recordAudit(tx, {
      userId,
      entity: 'instrument',
      entityId: id,
      action: 'update',
      summary: `Instrument ${label(after)} changed${words.length ? `: ${words.join(', ')}` : ''}`,
      before,
      after,
    });
    return after;
  });
}

/**
 * Removes an entry made by mistake. Readings keep their own snapshot of the instrument, so nothing stored
 * loses its meaning; an instrument that leaves service is better retired, which keeps its history here.
 */
export function deleteInstrument(db: Db, userId: string, id: string): void {
  db.transaction((tx) => {
    const before = mustFind(tx, id);
    tx.delete(instruments).where(eq(instruments.id, id)).run();
    recordAudit(tx, {
      userId,
      entity: 'instrument',
      entityId: id,
      action: 'delete',
      summary: `Instrument ${label(before)} removed`,
      before,
    });
  });
}

// ——— the declaration text ———

const DECLARATION_KEY = 'declaration';

export function getDeclarationSetting(db: Reader): DeclarationSetting {
  const row = db
    .select({ value: settings.value, updatedAt: settings.updatedAt, updatedByName: users.name })
    .from(settings)
    .leftJoin(users, eq(users.id, settings.updatedBy))
    .where(eq(settings.key, DECLARATION_KEY))
    .get();
  const value = row?.value as { text?: unknown } | undefined;
  if (!row || typeof value?.text !== 'string')
    return { text: DEFAULT_DECLARATION_TEXT, updatedAt: null, updatedByName: null };
  return { text: value.text, updatedAt: row.updatedAt, updatedByName: row.updatedByName };
}

export function setDeclarationText(
  db: Db,
  userId: string,
  text: string,
  now = new Date(),
): DeclarationSetting {
  return db.transaction((tx) => {
    const before = getDeclarationSetting(tx);
    const at = now.toISOString();
    tx.insert(settings)
      .values({ key: DECLARATION_KEY, value: { text }, updatedAt: at, updatedBy: userId })
      .onConflictDoUpdate({
        target: settings.key,
        set: { value: { text }, updatedAt: at, updatedBy: userId },
      })
      .run();
    recordAudit(tx, {
      userId,
      entity: 'setting',
      entityId: DECLARATION_KEY,
      action: before.updatedAt === null ? 'create' : 'update',
      summary: 'Declaration text changed',
      before: { text: before.text },
      after: { text },
    });
    return getDeclarationSetting(tx);
  });
}
