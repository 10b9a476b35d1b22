import fs from 'node:fs';
import path from 'node:path';

import { sql } from 'drizzle-orm';

import { keyIdOf, newPrivateKey, publicKeyOf } from '@/features/ledger';
import type { Db } from '@/server/db';

export type LedgerKey = { privateKey: string; publicKey: string; keyId: string };

/** The key's file in DATA_DIR, beside `jwt-secret`: 32 random bytes in hex, made once, readable by the server only. */
export const ledgerKeyFile = 'ledger-key';

const byFile = new Map<string, LedgerKey>();

/** Reads DATA_DIR/ledger-key, creating it on first use ('wx': two processes starting together keep one key). */
export function readOrCreateLedgerKey(dataDir: string): LedgerKey {
  const file = path.join(dataDir, ledgerKeyFile);
  const known = byFile.get(file);
  if (known) return known;
  try {
    fs.writeFileSync(file, newPrivateKey(), { flag: 'wx', mode: 0o600 });
  } catch (error) {
    const exists = typeof error === 'object' && error !== null && 'code' in error && error.code === 'EEXIST';
    if (!exists) throw error;
  }
  const privateKey = fs.readFileSync(file, 'utf8').trim();
  if (!/^[0-9a-f]{64}$/.test(privateKey))
    throw new Error(`${file} does not hold a 32-byte key in hex; the record chain cannot be countersigned.`);
  const publicKey = publicKeyOf(privateKey);
  const key = { privateKey, publicKey, keyId: keyIdOf(publicKey) };
  byFile.set(file, key);
  return key;
}

type Reader = Pick<Db, 'get'>;

/** The key of the data folder this connection's database lives in (the server's DATA_DIR). */
export function ledgerKeyOf(db: Reader): LedgerKey {
  const row = db.get<{ file: string }>(sql`SELECT file FROM pragma_database_list WHERE name = 'main'`);
  if (!row?.file) throw new Error('The record chain needs a database in a data folder, not one in memory.');
  return readOrCreateLedgerKey(path.dirname(row.file));
}
