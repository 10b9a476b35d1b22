/**
 * Smoothing and differentiation of measured samples: a Savitzky–Golay filter, i.e. a least-squares
 * polynomial fitted to the `windowPoints` samples nearest the evaluation time and differentiated
 * analytically. On evenly spaced samples evaluated at a sample time this is exactly the classic
 * Savitzky–Golay filter (A. Savitzky, M. J. E. Golay, Analytical Chemistry 36 (1964) 1627); the local fit
 * also handles uneven spacing (hand-timed readings) and evaluation between samples. Near the ends the
 * window slides inward instead of shrinking, so every fit uses the same number of points.
 *
 * Measured motion is no longer smoothed this way by default (its window counts samples, so its smoothing
 * changes with the sample rate): see conditioning/measured.ts. It remains for records too short to filter
 * and for profiles that still give `windowPoints`.
 */

export type LocalFit = { value: number; first: number; second: number };

/** Index of the last sample at or before t (0 when t is before the first). */
function lowerIndex(times: ArrayLike<number>, t: number): number {
  let lo = 0;
  let hi = times.length - 1;
  if (t <= times[0]) return 0;
  if (t >= times[hi]) return hi;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (times[mid] <= t) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Fits a polynomial of `degree` (1–4) to the `windowPoints` samples nearest `t` and returns its value,
 * first and second derivative at t. Scratch arrays are passed in so repeated fits allocate nothing.
 */
export function localPolynomialFit(
  times: ArrayLike<number>,
  values: ArrayLike<number>,
  t: number,
  windowPoints: number,
  degree: number,
  scratch: Float64Array = new Float64Array(40),
): LocalFit {
  const n = times.length;
  const w = Math.min(windowPoints, n);
  const k = degree + 1;
  if (w < k) throw new Error(`A degree-${degree} fit needs at least ${k} samples`);
  const nearest = lowerIndex(times, t);
  let start = nearest - ((w - 1) >> 1);
  if (start < 0) start = 0;
  if (start + w > n) start = n - w;
  // Scaled abscissa keeps the normal equations well conditioned whatever the time units.
  const scale = Math.max(Math.abs(times[start] - t), Math.abs(times[start + w - 1] - t)) || 1;
  const ata = scratch; // k×k at [0, k*k), right-hand side at [25, 25+k)
  ata.fill(0);
  const rhs = 25;
  for (let j = start; j < start + w; j++) {
    const x = (times[j] - t) / scale;
    const y = values[j];
    let pr = 1; // x^r
    for (let r = 0; r < k; r++) {
      let pc = pr * pr; // x^(r+c), starting at c = r

      for (let c = r; c < k; c++) {
        ata[r * k + c] += pc;
        pc *= x;
      }
      ata[rhs + r] += pr * y;
      pr *= x;
    }
  }
  for (let r = 0; r < k; r++) for (let c = 0; c < r; c++) ata[r * k + c] = ata[c * k + r];
  // Gaussian elimination in place; the system is symmetric positive definite for distinct times.
  for (let col = 0; col < k; col++) {
    let pivot = col;
    for (let r = col + 1; r < k; r++)
      if (Math.abs(ata[r * k + col]) > Math.abs(ata[pivot * k + col])) pivot = r;
    if (pivot !== col) {
      for (let c = 0; c < k; c++) {
        const tmp = ata[col * k + c];
        ata[col * k + c] = ata[pivot * k + c];
        ata[pivot * k + c] = tmp;
      }
      const tmp = ata[rhs + col];
      ata[rhs + col] = ata[rhs + pivot];
      ata[rhs + pivot] = tmp;
    }
    const d = ata[col * k + col];
    if (Math.abs(d) < 1e-14) throw new Error('Sample times too close together to fit');
    for (let r = col + 1; r < k; r++) {
      const f = ata[r * k + col] / d;
      for (let c = col; c < k; c++) ata[r * k + c] -= f * ata[col * k + c];
      ata[rhs + r] -= f * ata[rhs + col];
    }
  }
  const coef = 32; // solution at [32, 32+k)
  for (let r = k - 1; r >= 0; r--) {
    let sum = ata[rhs + r];
    for (let c = r + 1; c < k; c++) sum -= ata[r * k + c] * ata[coef + c];
    ata[coef + r] = sum / ata[r * k + r];
  }
  return {
    value: ata[coef],
    first: k > 1 ? ata[coef + 1] / scale : 0,
    second: k > 2 ? (2 * ata[coef + 2]) / (scale * scale) : 0,
  };
}
