/**
 * The automatic cut-off: chosen from the record's own spectrum.
 *
 * The record (on an even grid, its chord between the ends removed) is windowed with a Hann window and
 * transformed (radix-2 FFT, zero-padded). White sensor noise of RMS σ (estimated from the raw samples,
 * `estimateNoise` in record.ts) puts the same level σ²·Σw² into every periodogram bin, each bin spread
 * exponentially around it. The motion's content reaches as far as
 * the highest (locally averaged) bin that stands clearly above that floor. Above it the record is noise only, so the cut-off is put a
 * little beyond it: that keeps every harmonic the record can resolve and drops the band where only noise
 * lives (the idea of Wiener's optimal filter reduced to a choice of cut-off). The periodogram of white
 * noise and its exponential (χ² with 2 degrees of freedom) bins: D. B. Percival, A. T. Walden, Spectral
 * Analysis for Physical Applications (1993), ch. 6. FFT: J. W. Cooley, J. W. Tukey, Math. Comp. 19 (1965) 297.
 */
import { select } from '@/features/loads/engine/conditioning/record';

/**
 * A smoothed bin counts as motion above this many times the noise floor: the mean of five noise bins
 * exceeds 6× their level only rarely (a Gamma tail; the Hann window's overlap between neighbouring
 * bins fattens it), so noise seldom passes.
 */
export const CONTENT_THRESHOLD = 6;
/** Ride motion starts below this: the scan for its content looks at least this far up. */
export const FIRST_SEARCH_HZ = 1.5;
/** Cut-off = this × the highest frequency where the motion stands above the noise. */
export const CONTENT_MARGIN = 1.5;
/** The automatic cut-off never goes below this (slow rides still keep their ramps and swings). */
export const MIN_AUTO_CUTOFF_HZ = 0.5;
/** Nor above this fraction of the sample rate, where derivatives of sampled data lose accuracy. */
export const MAX_CUTOFF_FRACTION = 0.2;

export type MotionContent = {
  /** Estimated RMS of the white noise on the record, in the record's unit. */
  noiseRms: number;
  /** Highest frequency where the motion stands out of the noise; null when nothing does. */
  contentHz: number | null;
  /** The strongest frequency of the motion (its swing or ripple), null when none stands out. */
  dominantHz: number | null;
  cutoffHz: number;
  /** The motion has content up to the cap: the record is sampled too slowly for it. */
  limitedByRate: boolean;
};

/** In-place iterative radix-2 FFT; `re`/`im` have a power-of-two length. */
export function fft(re: Float64Array, im: Float64Array): void {
  const n = re.length;
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i];
      re[i] = re[j];
      re[j] = t;
      t = im[i];
      im[i] = im[j];
      im[j] = t;
    }
  }
  for (let len = 2; len <= n; len <<= 1) {
    const ang = (-2 * Math.PI) / len;
    const wr = Math.cos(ang);
    const wi = Math.sin(ang);
    for (let i = 0; i < n; i += len) {
      let cr = 1;
      let ci = 0;
      for (let k = 0; k < len / 2; k++) {
        const a = i + k;
        const b = a + len / 2;
        const xr = re[b] * cr - im[b] * ci;
        const xi = re[b] * ci + im[b] * cr;
        re[b] = re[a] - xr;
        im[b] = im[a] - xi;
        re[a] += xr;
        im[a] += xi;
        const nr = cr * wr - ci * wi;
        ci = cr * wi + ci * wr;
        cr = nr;
      }
    }
  }
}

function movingAverage(values: Float64Array, width: number): Float64Array {
  const out = new Float64Array(values.length);
  const half = width >> 1;
  let sum = 0;
  let count = 0;
  let lo = 0;
  let hi = -1;
  for (let k = 0; k < values.length; k++) {
    const from = Math.max(0, k - half);
    const to = Math.min(values.length - 1, k + half);
    while (hi < to) {
      hi++;
      sum += values[hi];
      count++;
    }
    while (lo < from) {
      sum -= values[lo];
      lo++;
      count--;
    }
    out[k] = sum / count;
  }
  return out;
}

/** Noise level, motion content and the automatic cut-off of an evenly sampled record. */
export function analyseContent(
  values: ArrayLike<number>,
  sampleRateHz: number,
  noiseRms: number,
): MotionContent {
  const n = values.length;
  let size = 1;
  while (size < n) size <<= 1;
  const re = new Float64Array(size);
  const im = new Float64Array(size);
  const slope = (values[n - 1] - values[0]) / (n - 1);
  let sumW2 = 0;
  for (let k = 0; k < n; k++) {
    const w = 0.5 * (1 - Math.cos((2 * Math.PI * k) / (n - 1)));
    re[k] = w * (values[k] - values[0] - slope * k);
    sumW2 += w * w;
  }
  fft(re, im);
  const half = size >> 1;
  const power = new Float64Array(half + 1);
  let peak = 0;
  for (let k = 0; k <= half; k++) {
    power[k] = re[k] * re[k] + im[k] * im[k];
    if (power[k] > peak) peak = power[k];
  }
  const binHz = sampleRateHz / size;
  // Each bin averaged with its neighbours over about five independent bins (zero padding interpolates
  // between them): a lone noise bin no longer crosses the threshold, a line of the motion still does.
  const width = Math.max(1, Math.round((5 * size) / n));
  const smooth = movingAverage(power, width);
  // White noise of RMS σ puts σ²·Σw² into every bin on average; the median of the upper half of the band
  // (no ride moves there) divided by ln 2 measures the same level directly. The larger of the two is used,
  // since a floor set too low lets noise pass as motion. A record with (almost) no noise: anything 80 dB
  // under its strongest line is the floor.
  const upper = power.slice(Math.ceil(half / 2));
  const floor = Math.max(
    noiseRms * noiseRms * sumW2,
    select(upper, upper.length >> 1) / Math.LN2,
    1e-8 * peak,
    1e-300,
  );
  const threshold = CONTENT_THRESHOLD * floor;
  // The Hann window's main lobe around 0 Hz holds what is left of the trend, not motion.
  const firstBin = Math.ceil((2 * size) / n);
  const lastBin = Math.floor(0.45 * size);
  let content = -1;
  let dominant = -1;
  // Scan upward; motion is a line or a band joined to the lower ones (a swing's odd harmonics, a ramp's
  // falling spectrum), so stop once the scan has gone twice as far as the last line found without finding
  // another. A lone noise excursion far above the motion then cannot set the cut-off.
  for (let k = firstBin; k <= lastBin; k++) {
    const frontier =
      Math.max(FIRST_SEARCH_HZ, 2 * (content < 0 ? 0 : content * binHz)) + 4 * (size / n) * binHz;
    if (k * binHz > frontier) break;
    if (smooth[k] <= threshold) continue;
    content = k;
    if (dominant < 0 || power[k] > power[dominant]) dominant = k;
  }
  const contentHz = content >= 0 ? content * binHz : null;
  const cap = MAX_CUTOFF_FRACTION * sampleRateHz;
  const wanted = contentHz === null ? 0 : CONTENT_MARGIN * contentHz;
  return {
    noiseRms,
    contentHz,
    dominantHz: dominant >= 0 ? dominant * binHz : null,
    cutoffHz: Math.min(cap, Math.max(wanted, MIN_AUTO_CUTOFF_HZ)),
    limitedByRate: wanted > cap,
  };
}
