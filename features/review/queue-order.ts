/**
 * The inspections of the queue page last shown, in its order, so that an inspection opened from it can
 * step to the next or previous one (j / k on the inspection). Kept in memory for this tab only: an
 * inspection opened from a link or after a reload has no queue order, and the keys then do nothing.
 */
let order: readonly string[] = [];

export function rememberQueueOrder(inspectionIds: readonly string[]) {
  order = [...inspectionIds];
}

/** The inspection `step` places from `current` in the remembered order, or null (none, or at an end). */
export function queueNeighbour(current: string, step: 1 | -1): string | null {
  const at = order.indexOf(current);
  if (at < 0) return null;
  return order[at + step] ?? null;
}
