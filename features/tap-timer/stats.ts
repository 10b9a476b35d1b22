/**
 * Tap timer statistics: from the times of taps made at each revolution (or swing), the intervals
 * between them, which intervals to trust, and the period, rate and spread of the ones kept.
 *
 * Rules, applied to each interval against the median of all intervals (the median is not pulled by the
 * bad taps it is meant to find):
 *  1. about twice the median (ratio 1.7–2.3): a tap was missed;
 *  2. about half the median (ratio 0.35–0.65) or less: an extra tap;
 *  3. otherwise, further from the median than 3 robust standard deviations, with the robust standard
 *     deviation estimated as 1.4826 · MAD (median absolute deviation). 1.4826 = 1/Φ⁻¹(0.75) makes MAD
 *     estimate σ for normally distributed data; the threshold 3 is the "very conservative" choice in
 *     Leys et al. (2013), "Detecting outliers: Do not use standard deviation around the mean, use absolute
 *     deviation around the median", J. Exp. Soc. Psychol. 49(4) — cited from memory.
 * Our own addition: the robust standard deviation is floored at 2 % of the median, because a hand on a
 * screen jitters by tens of milliseconds and a handful of nearly equal intervals would otherwise give a
 * MAD near zero and flag every ordinary tap.
 * Rules run only from MIN_INTERVALS_FOR_CHECKS intervals on: with fewer, no median is trustworthy.
 */

export const MIN_INTERVALS_FOR_CHECKS = 3;
export const MAD_TO_SD = 1.4826;
const MAD_THRESHOLD = 3;
const SD_FLOOR_OF_MEDIAN = 0.02;

type IntervalVerdict = {
  /** 0-based: interval i runs from tap i to tap i + 1. */
  index: number;
  seconds: number;
  kept: boolean;
  reason: string | null;
};

type TapStats = {
  taps: number;
  intervals: IntervalVerdict[];
  used: number;
  discarded: number;
  /** Over all intervals: the reference for the rules. */
  medianAllS: number;
  /** Over the intervals kept (null when none is kept). */
  meanS: number | null;
  medianS: number | null;
  /** Sample standard deviation (n − 1) of the kept intervals; null below two. */
  sdS: number | null;
  minS: number | null;
  maxS: number | null;
  /** max − min of the kept intervals. */
  rangeS: number | null;
  /** The period: the mean of the kept intervals. */
  periodS: number | null;
  /** Revolutions (or swings) per minute: 60 / period. */
  rpm: number | null;
  /** The spread to record with the reading: the standard deviation of the kept intervals. */
  spreadS: number | null;
};

export function median(values: readonly number[]): number {
  if (values.length === 0) throw new Error('median of no values');
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}

function mean(values: readonly number[]): number {
  return values.reduce((a, b) => a + b, 0) / values.length;
}

/** Sample standard deviation (Bessel's n − 1). */
export function sampleSd(values: readonly number[]): number {
  const m = mean(values);
  return Math.sqrt(values.reduce((a, v) => a + (v - m) ** 2, 0) / (values.length - 1));
}

/** Median absolute deviation from the median (unscaled). */
export function mad(values: readonly number[]): number {
  const m = median(values);
  return median(values.map((v) => Math.abs(v - m)));
}

const fmt = (x: number) => x.toFixed(2);

/** Why an interval is not trusted, or null when it is. */
function verdict(seconds: number, med: number, robustSd: number): string | null {
  const ratio = seconds / med;
  if (ratio >= 1.7 && ratio <= 2.3)
    return `${fmt(seconds)} s is about twice the usual ${fmt(med)} s: a missed tap?`;
  if (ratio <= 0.65) return `${fmt(seconds)} s is half the usual ${fmt(med)} s or less: an extra tap?`;
  if (Math.abs(seconds - med) > MAD_THRESHOLD * robustSd)
    return `${fmt(seconds)} s is more than ${MAD_THRESHOLD} robust standard deviations (${fmt(robustSd)} s) from the usual ${fmt(med)} s.`;
  return null;
}

/**
 * `tapsMs`: tap times in milliseconds, in the order tapped (any clock). Null below two taps. Taps that
 * are not strictly increasing are an error: the caller's clock went backwards.
 */
export function tapStats(tapsMs: readonly number[]): TapStats | null {
  if (tapsMs.length < 2) return null;
  const seconds: number[] = [];
  for (let i = 1; i < tapsMs.length; i++) {
    const d = (tapsMs[i] - tapsMs[i - 1]) / 1000;
    if (!(d > 0) || !Number.isFinite(d)) throw new Error(`Tap ${i + 1} is not after tap ${i}.`);
    seconds.push(d);
  }
  const medAll = median(seconds);
  const check = seconds.length >= MIN_INTERVALS_FOR_CHECKS;
  const robustSd = Math.max(MAD_TO_SD * mad(seconds), SD_FLOOR_OF_MEDIAN * medAll);
  const intervals = seconds.map((s, index) => {
    const reason = check ? verdict(s, medAll, robustSd) : null;
    return { index, seconds: s, kept: reason === null, reason };
  });
  const kept = intervals.filter((i) => i.kept).map((i) => i.seconds);
  const has = kept.length > 0;
  const meanS = has ? mean(kept) : null;
  const sdS = kept.length >= 2 ? sampleSd(kept) : null;
  const minS = has ? Math.min(...kept) : null;
  const maxS = has ? Math.max(...kept) : null;
  return {
    taps: tapsMs.length,
    intervals,
    used: kept.length,
    discarded: seconds.length - kept.length,
    medianAllS: medAll,
    meanS,
    medianS: has ? median(kept) : null,
    sdS,
    minS,
    maxS,
    rangeS: minS !== null && maxS !== null ? maxS - minS : null,
    periodS: meanS,
    rpm: meanS ? 60 / meanS : null,
    spreadS: sdS,
  };
}

export type TapTimerResult = {
  periodS: number;
  rpm: number;
  /** Standard deviation of the kept intervals, seconds. */
  spreadS: number;
  used: number;
  discarded: number;
};

/** The value to record, once at least MIN_INTERVALS_FOR_CHECKS intervals are kept; else null. */
export function tapResult(stats: TapStats): TapTimerResult | null {
  const { periodS, rpm, spreadS, used, discarded } = stats;
  if (used < MIN_INTERVALS_FOR_CHECKS || periodS === null || rpm === null || spreadS === null) return null;
  return { periodS, rpm, spreadS, used, discarded };
}
