/**
 * In the browser, expo-sqlite keeps the database in OPFS through sync access handles, which are exclusive
 * to one holder: a second tab's worker fails with NoModificationAllowedError while creating them. The
 * error crosses the worker boundary as text only, so it is recognised by its name and wording.
 */
export function isDatabaseLockedError(err: unknown): boolean {
  const text = err instanceof Error ? `${err.name} ${err.message}` : String(err);
  return /NoModificationAllowedError|Access Handles? cannot be created|another open Access Handle/i.test(
    text,
  );
}
