/**
 * Zero-phase Butterworth low-pass filtering of evenly sampled records.
 *
 * Design: the analog Butterworth prototype (S. Butterworth, "On the theory of filter amplifiers",
 * Wireless Engineer 7 (1930) 536) of even order N, split into N/2 second-order sections, each mapped to a
 * digital biquad by the bilinear transform with the cut-off pre-warped by tan(π·f/fs) (A. V. Oppenheim,
 * R. W. Schafer, Discrete-Time Signal Processing, 3rd ed., §7.2). Each section has unit gain at 0 Hz.
 *
 * Zero phase: the cascade runs forward and then backward over the record (the forward–backward scheme of
 * F. Gustafsson, IEEE Trans. Signal Processing 44 (1996) 988, which scipy's `filtfilt` follows). The
 * magnitude response is then squared, so the design cut-off is moved up by Winter's correction
 * C = (2^(1/passes) − 1)^(1/(2N)) so that the two-pass response is −3 dB at the requested cut-off
 * (D. A. Winter, Biomechanics and Motor Control of Human Movement, 4th ed., 2009, §3.4.4).
 *
 * Ends: before filtering, each end is extended by an odd reflection about a local cubic fit at the end,
 * with a bounded curvature term so value, slope and curvature run on smoothly into the extension; the
 * filter then starts in its steady state. A zero-phase Butterworth response is maximally flat at 0 Hz, so
 * slow polynomial-like motion passes unchanged right up to the ends instead of being bent toward a mirror.
 */

/** One second-order section, y = b0·x + z1 (direct form II transposed), a0 = 1. */
export type Biquad = { b0: number; b1: number; b2: number; a1: number; a2: number };

/**
 * The sections of an order-`order` (even) Butterworth low-pass for a record sampled at `sampleRateHz`,
 * corrected for `passes` runs (2 = forward and backward) so the overall response is −3 dB at `cutoffHz`.
 */
export function butterworthSections(
  order: number,
  cutoffHz: number,
  sampleRateHz: number,
  passes = 2,
): Biquad[] {
  if (!(order >= 2 && order % 2 === 0)) throw new Error('The Butterworth order must be even');
  if (!(cutoffHz > 0 && cutoffHz < sampleRateHz / 2)) throw new Error('The cut-off must lie below Nyquist');
  const correction = Math.pow(Math.pow(2, 1 / passes) - 1, 1 / (2 * order));
  const k = Math.tan((Math.PI * cutoffHz) / sampleRateHz) / correction;
  const sections: Biquad[] = [];
  for (let j = 0; j < order / 2; j++) {
    // The conjugate pole pair j of the analog prototype has quality factor 1/(2·sin((2j+1)π/(2N))).
    const q = 1 / (2 * Math.sin(((2 * j + 1) * Math.PI) / (2 * order)));
    const norm = 1 / (1 + k / q + k * k);
    const b0 = k * k * norm;
    sections.push({
      b0,
      b1: 2 * b0,
      b2: b0,
      a1: 2 * (k * k - 1) * norm,
      a2: (1 - k / q + k * k) * norm,
    });
  }
  return sections;
}

/** Runs the cascade over `x` in place, forward then backward, each pass starting in steady state. */
export function filterForwardBackward(x: Float64Array, sections: readonly Biquad[]): void {
  const n = x.length;
  if (n === 0) return;
  for (const s of sections) runSection(x, s, 0, n, 1);
  for (const s of sections) runSection(x, s, n - 1, -1, -1);
}

function runSection(x: Float64Array, s: Biquad, from: number, to: number, step: number): void {
  const { b0, b1, b2, a1, a2 } = s;
  // Steady state for a constant input x0 (unit gain at 0 Hz): the filter starts as if it had always seen x0.
  const x0 = x[from];
  let z2 = (b2 - a2) * x0;
  let z1 = (b1 - a1) * x0 + z2;
  for (let k = from; k !== to; k += step) {
    const v = x[k];
    const y = b0 * v + z1;
    z1 = b1 * v - a1 * y + z2;
    z2 = b2 * v - a2 * y;
    x[k] = y;
  }
}

/**
 * `x` (evenly spaced by `stepS`) with `pad` extension samples before and after, reflected oddly about a
 * cubic fitted to the `fitPoints` samples at each end. The curvature term 2(1 − cos βτ)/β² equals τ²
 * near the end (so the extension keeps the end's curvature) and stays bounded far out.
 */
export function padForFilter(
  x: ArrayLike<number>,
  stepS: number,
  pad: number,
  fitPoints: number,
  cutoffHz: number,
  noiseRms = 0,
) {
  const n = x.length;
  const p = Math.max(0, Math.min(pad, n - 1));
  const out = new Float64Array(n + 2 * p);
  for (let k = 0; k < n; k++) out[p + k] = x[k];
  if (p === 0) return { values: out, pad: 0 };
  const start = endFit(x, stepS, false, fitPoints, noiseRms);
  const end = endFit(x, stepS, true, fitPoints, noiseRms);
  // The end samples themselves become the fitted values: a noisy end sample would otherwise stand out of
  // its own reflection as a spike and tilt the slope at the end.
  out[p] = start.value;
  out[p + n - 1] = end.value;
  const beta = (Math.PI * cutoffHz) / 4;
  for (let j = 1; j <= p; j++) {
    const tau = j * stepS;
    const bend = beta * tau < 1e-4 ? tau * tau : (2 * (1 - Math.cos(beta * tau))) / (beta * beta);
    out[p - j] = 2 * start.value - x[j] + start.second * bend;
    out[p + n - 1 + j] = 2 * end.value - x[n - 1 - j] + end.second * bend;
  }
  return { values: out, pad: p };
}

/**
 * Value and curvature at one end from a least-squares cubic over its `fitPoints` samples. The filtered
 * record's ends follow this fit, so it sets their accuracy: about twice as noisy as inside the record.
 * (Tried and worse on the test sweep: a window grown by a χ² lack-of-fit test, and the curvature from
 * a window 1.5–2× longer.)
 */
function endFit(x: ArrayLike<number>, stepS: number, atEnd: boolean, fitPoints: number, noiseRms: number) {
  const fit = cubicAtEnd(x, stepS, atEnd, Math.max(5, Math.min(x.length, fitPoints)));
  // With a known noise level the end curvature is shrunk by its own signal-to-noise ratio,
  // c·max(0, 1 − 9·var/c²) (a shrinkage estimator in the manner of Wiener's and James–Stein's): a
  // curvature that does not stand 3 standard errors above its noise (a ride at rest, read noisily) no
  // longer bends the ends; one well above it (a swing's extreme) is kept. On the test sweep of 2,400 noisy
  // records this took the cases beyond 3 % from 9 to 1.
  const variance = noiseRms * noiseRms * fit.secondPerNoise2;
  const c2 = fit.second * fit.second;
  const keep = c2 > 0 ? Math.max(0, 1 - (9 * variance) / c2) : 1;
  return { value: fit.value, second: fit.second * keep };
}

/** Cubic least squares over the m samples at one end; u = distance from the end in units of the window. */
function cubicAtEnd(x: ArrayLike<number>, stepS: number, atEnd: boolean, m: number) {
  const n = x.length;
  const a = new Float64Array(20); // 4×4 normal matrix, then the right-hand side at 16
  const at = (j: number) => x[atEnd ? n - 1 - j : j];
  for (let j = 0; j < m; j++) {
    const u = j / (m - 1);
    const y = at(j);
    let pr = 1;
    for (let r = 0; r < 4; r++) {
      let pc = pr;
      for (let c = 0; c < 4; c++) {
        a[r * 4 + c] += pc;
        pc *= u;
      }
      a[16 + r] += pr * y;
      pr *= u;
    }
  }
  const normal = a.slice(0, 16);
  const coef = solve4(a);
  // Variance of the u² coefficient per unit noise variance: element (2,2) of the inverse normal matrix.
  const unit = new Float64Array(20);
  unit.set(normal);
  unit[18] = 1;
  const inv22 = solve4(unit)[2];
  const w = (m - 1) * stepS;
  // Curvature is even in the direction of u, so the same expression holds at either end.
  return { value: coef[0], second: (2 * coef[2]) / (w * w), secondPerNoise2: (4 * inv22) / (w * w * w * w) };
}

/** Gaussian elimination with partial pivoting of the 4×4 system packed as in cubicAtEnd. */
function solve4(a: Float64Array): number[] {
  for (let col = 0; col < 4; col++) {
    let piv = col;
    for (let r = col + 1; r < 4; r++) if (Math.abs(a[r * 4 + col]) > Math.abs(a[piv * 4 + col])) piv = r;
    if (piv !== col) {
      for (let c = 0; c < 4; c++) [a[col * 4 + c], a[piv * 4 + c]] = [a[piv * 4 + c], a[col * 4 + c]];
      [a[16 + col], a[16 + piv]] = [a[16 + piv], a[16 + col]];
    }
    for (let r = col + 1; r < 4; r++) {
      const f = a[r * 4 + col] / a[col * 4 + col];
      for (let c = col; c < 4; c++) a[r * 4 + c] -= f * a[col * 4 + c];
      a[16 + r] -= f * a[16 + col];
    }
  }
  const out = [0, 0, 0, 0];
  for (let r = 3; r >= 0; r--) {
    let sum = a[16 + r];
    for (let c = r + 1; c < 4; c++) sum -= a[r * 4 + c] * out[c];
    out[r] = sum / a[r * 4 + r];
  }
  return out;
}

/**
 * Zero-phase low-pass of an evenly sampled record: returns the filtered record with `keep` extension samples
 * still attached at each end (for derivative stencils), or fewer when the record is too short.
 */
export function zeroPhaseLowPass(
  x: ArrayLike<number>,
  sampleRateHz: number,
  cutoffHz: number,
  order: number,
  keep = 0,
  noiseRms = 0,
): { values: Float64Array; pad: number } {
  const n = x.length;
  const step = 1 / sampleRateHz;
  // Detrend by the chord between the ends so a steady rotation's angle filters without a start-up transient.
  const slope = (x[n - 1] - x[0]) / (n - 1);
  const rest = new Float64Array(n);
  for (let k = 0; k < n; k++) rest[k] = x[k] - (x[0] + slope * k);
  // Four periods of the cut-off: the filter's memory has died out well before the record starts.
  const want = Math.max(keep, Math.ceil((4 * sampleRateHz) / cutoffHz));
  // A cubic over one cut-off period: long enough to average the noise, short enough to follow the motion
  // (tried on noisy swings, rotations and ramps at 25–200 Hz: a quadratic, or a cubic over a half or two
  // periods, left the ends measurably worse).
  const fitPoints = Math.max(8, Math.round(sampleRateHz / cutoffHz));
  const padded = padForFilter(rest, step, want, fitPoints, cutoffHz, noiseRms);
  filterForwardBackward(padded.values, butterworthSections(order, cutoffHz, sampleRateHz, 2));
  const kept = Math.min(keep, padded.pad);
  const values = new Float64Array(n + 2 * kept);
  const offset = padded.pad - kept;
  for (let k = 0; k < values.length; k++) values[k] = padded.values[offset + k] + x[0] + slope * (k - kept);
  return { values, pad: kept };
}
