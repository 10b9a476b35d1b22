/**
 * The sample under a chart's cursor, as plain functions (no React): a series' samples in x order once
 * (`sampleOrder`), then each look-up a binary search (`nearestRank`), so a long series (a decimated
 * cycle from the server keeps thousands of instants and every exact peak) costs O(log n) per pointer move.
 */

/**
 * The indices of a series' samples with a finite x and y, in ascending x (ties in sample order). A series
 * whose x already ascends (time, a sorted angle) is only filtered; one that turns back on itself (an arm
 * angle over several turns, a swing's return stroke) is sorted.
 */
export function sampleOrder(x: ArrayLike<number>, y: ArrayLike<number | null>): number[] {
  const order: number[] = [];
  let sorted = true;
  for (let i = 0; i < x.length; i++) {
    const yi = y[i];
    if (!Number.isFinite(x[i]) || yi === null || !Number.isFinite(yi)) continue;
    if (order.length > 0 && x[i] < x[order[order.length - 1]]) sorted = false;
    order.push(i);
  }
  if (!sorted) order.sort((a, b) => x[a] - x[b] || a - b);
  return order;
}

/**
 * The rank (position in `order`) of the sample whose x is nearest `target`; on a tie the lower x. -1 for
 * an empty order.
 */
export function nearestRank(x: ArrayLike<number>, order: readonly number[], target: number): number {
  if (order.length === 0 || Number.isNaN(target)) return -1;
  // First rank whose x is at or past the target.
  let lo = 0;
  let hi = order.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (x[order[mid]] < target) lo = mid + 1;
    else hi = mid;
  }
  if (lo === 0) return 0;
  if (lo === order.length) return order.length - 1;
  return target - x[order[lo - 1]] <= x[order[lo]] - target ? lo - 1 : lo;
}
