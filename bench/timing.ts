/** Timing helpers shared by the benchmarks: per-call times after a warm-up, and their median/percentiles. */

export const now = () => performance.now();

export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

export function percentile(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(p * s.length))];
}

/** Repeats `fn` until `seconds` pass (after `warmup` calls) and returns the per-call times in ms. */
export function timeCalls(fn: () => void, seconds = 1, warmup = 20): number[] {
  for (let i = 0; i < warmup; i++) fn();
  const times: number[] = [];
  const end = now() + seconds * 1000;
  while (now() < end) {
    const t0 = now();
    fn();
    times.push(now() - t0);
  }
  return times;
}
