/**
 * The automatic cut-off: chosen from the record's own spectrum.
 *
 * The record (on an even grid, its chord between the ends removed) is windowed with a Hann window and
 * transformed (radix-2 FFT, zero-padded). For white sensor noise every periodogram bin is exponentially
 * distributed around the same level, so the noise floor is the median of the bins above a quarter of the
 * sample rate divided by ln 2 (ride motion has no content there). The motion's content reaches as far as
 * the highest bin that stands clearly above that floor (a threshold of ln(bins) + 5 floors, so pure noise
 * crosses it in well under 1 % of records). Above it the record is noise only, so the cut-off is put a
 * little beyond it: that keeps every harmonic the record can resolve and drops the band where only noise
 * lives (the idea of Wiener's optimal filter reduced to a choice of cut-off). The periodogram of white
 * noise and its exponential (χ² with 2 degrees of freedom) bins: D. B. Percival, A. T. Walden, Spectral
 * Analysis for Physical Applications (1993), ch. 6. FFT: J. W. Cooley, J. W. Tukey, Math. Comp. 19 (1965) 297.
 */

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

/** Noise level, motion content and the automatic cut-off of an evenly sampled record. */
export function analyseContent(values: ArrayLike<number>, sampleRateHz: number): MotionContent {
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
  const upper = power.subarray(Math.ceil(half / 2));
  const sorted = Float64Array.from(upper).sort();
  const measuredFloor = sorted[sorted.length >> 1] / Math.LN2;
  // A record with (almost) no noise: treat anything 80 dB under its strongest line as the floor.
  const floor = Math.max(measuredFloor, 1e-8 * peak, 1e-300);
  const threshold = Math.max(8, Math.log(n / 2) + 5) * floor;
  // The Hann window's main lobe around 0 Hz holds what is left of the trend, not motion.
  const firstBin = Math.ceil((2 * size) / n);
  const lastBin = Math.floor(0.45 * size);
  let content = -1;
  let dominant = -1;
  for (let k = firstBin; k <= lastBin; k++) {
    if (power[k] <= threshold) continue;
    content = k;
    if (dominant < 0 || power[k] > power[dominant]) dominant = k;
  }
  const contentHz = content >= 0 ? content * binHz : null;
  const cap = MAX_CUTOFF_FRACTION * sampleRateHz;
  const wanted = contentHz === null ? 0 : CONTENT_MARGIN * contentHz;
  return {
    noiseRms: Math.sqrt(measuredFloor / sumW2),
    contentHz,
    dominantHz: dominant >= 0 ? dominant * binHz : null,
    cutoffHz: Math.min(cap, Math.max(wanted, MIN_AUTO_CUTOFF_HZ)),
    limitedByRate: wanted > cap,
  };
}
