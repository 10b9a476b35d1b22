/**
 * Writing a stored file whole: photos and NDT reports are kept by content, and a database row says the
 * bytes are there, so a file must never be seen half written.
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/** What an interrupted write leaves behind (swept later by its store). */
export const TEMP_SUFFIX = '.part';

/** Writes to a temporary name, flushes, renames into place, then makes the rename durable. */
export async function writeWhole(file: string, bytes: Uint8Array): Promise<void> {
  const dir = path.dirname(file);
  await fs.promises.mkdir(dir, { recursive: true });
  const temp = path.join(dir, `.${path.basename(file)}.${randomUUID()}${TEMP_SUFFIX}`);
  // Photos, reports and notices are private records: readable by the server's own user only.
  const handle = await fs.promises.open(temp, 'wx', 0o600);
  try {
    await handle.writeFile(bytes);
    await handle.sync();
  } finally {
    await handle.close();
  }
  try {
    // Rename is atomic on one file system: readers see no file or the whole file, never part of one.
    await fs.promises.rename(temp, file);
  } catch (err) {
    await fs.promises.rm(temp, { force: true });
    throw err;
  }
  // Make the rename itself durable before the database row says the file is stored.
  const dirHandle = await fs.promises.open(dir, 'r');
  try {
    await dirHandle.sync();
  } finally {
    await dirHandle.close();
  }
}

/**
 * Everything the server creates afterwards (database, WAL, mailbox, secrets, backups) is private to its
 * user whatever the shell's umask was: new directories 0700, new files 0600. Worker threads cannot set it;
 * they inherit the process's.
 */
export function restrictNewFiles(): void {
  try {
    process.umask(0o077);
  } catch {
    // In a worker thread: the main thread has set it for the whole process.
  }
}

/**
 * Creates `dir` 0700, or takes group and other access off one an earlier release left open (its photos
 * were written 0644 then). Says which, so the caller can log a change; `failed` when it is not ours to change.
 */
export function makePrivateDir(dir: string): 'created' | 'tightened' | 'kept' | 'failed' {
  const before = fs.statSync(dir, { throwIfNoEntry: false });
  if (!before) {
    fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
    return 'created';
  }
  if ((before.mode & 0o077) === 0) return 'kept';
  try {
    fs.chmodSync(dir, before.mode & 0o700);
    return 'tightened';
  } catch {
    return 'failed';
  }
}
