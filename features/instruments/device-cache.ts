/**
 * The phone's copy of the instrument register and the declaration text, written by the pull and read by
 * the recording screen. Readers check each row against the schema and skip what no longer parses.
 */
import { eq } from 'drizzle-orm';

import { cachedInstruments, cachedSettings } from '@/db/device/schema';
import type { DeviceDb } from '@/features/device-db';
import {
  type DeclarationSetting,
  type Instrument,
  declarationSettingSchema,
  instrumentSchema,
} from '@/features/instruments/schema';

/** Replaces the whole register: an instrument the server no longer lists is no longer offered. */
export async function writeInstruments(dev: DeviceDb, list: Instrument[], now = new Date()): Promise<void> {
  await dev.db.delete(cachedInstruments).run();
  for (const i of list)
    await dev.db
      .insert(cachedInstruments)
      .values({ id: i.id, json: JSON.stringify(i), updatedAt: now.toISOString() })
      .run();
}

export async function readInstruments(dev: DeviceDb): Promise<Instrument[]> {
  const out: Instrument[] = [];
  for (const row of await dev.db.select().from(cachedInstruments).all()) {
    const parsed = instrumentSchema.safeParse(JSON.parse(row.json));
    if (parsed.success) out.push(parsed.data);
  }
  return out;
}

export async function writeDeclarationSetting(
  dev: DeviceDb,
  setting: DeclarationSetting,
  now = new Date(),
): Promise<void> {
  const row = { key: 'declaration', json: JSON.stringify(setting), updatedAt: now.toISOString() };
  await dev.db
    .insert(cachedSettings)
    .values(row)
    .onConflictDoUpdate({ target: cachedSettings.key, set: { json: row.json, updatedAt: row.updatedAt } })
    .run();
}

/** Null before the first pull that carried it: the phone then cannot make the declaration. */
export async function readDeclarationSetting(dev: DeviceDb): Promise<DeclarationSetting | null> {
  const row = await dev.db.select().from(cachedSettings).where(eq(cachedSettings.key, 'declaration')).get();
  if (!row) return null;
  const parsed = declarationSettingSchema.safeParse(JSON.parse(row.json));
  return parsed.success ? parsed.data : null;
}
