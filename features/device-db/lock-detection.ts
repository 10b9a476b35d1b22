/** On a phone the app is one process with its own database file: no other tab can hold it. */
export function isDatabaseLockedError(_err: unknown): boolean {
  return false;
}
