/**
 * Wear trends: a least-squares straight line through a pivot's readings (pin diameter or bushing
 * clearance) against days or against logged ride cycles, its 95 % prediction interval, and where the line
 * and the interval's bound reach the wear limit.
 *
 * Ordinary least squares and the prediction interval of a new observation at x (any regression text, e.g.
 * Montgomery & Runger, Applied Statistics and Probability for Engineers, §11.7; from memory):
 *   b = Sxy/Sxx, a = ȳ − b·x̄, s² = Σ(y − a − b·x)²/(n − 2),
 *   ŷ(x) ± t(0.975, n − 2)·s·√(1 + 1/n + (x − x̄)²/Sxx).
 * Student's t quantile: the t distribution function through the regularized incomplete beta function,
 * P(|T| ≤ t) = 1 − I_{ν/(ν+t²)}(ν/2, 1/2) (Abramowitz & Stegun 26.7.1 with 26.5.27), I evaluated by its
 * continued fraction (Numerical Recipes §6.4, modified Lentz), ln Γ by Lanczos (g = 7, n = 9); the quantile
 * by bisection. Checked against tabulated values in tests/engine/wear-trend.test.ts.
 *
 * With two readings the line goes through both and leaves no degrees of freedom: no interval, so no
 * cautious date. Pure TypeScript: the server projects, the app only shows.
 */
import { addDays, daysBetween } from '@/lib/dates';

// ——— Student's t ———

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Γ(x) for x > 0 (Lanczos approximation, g = 7; about 15 significant digits). */
export function lnGamma(x: number): number {
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - lnGamma(1 - x);
  const z = x - 1;
  let sum = LANCZOS[0];
  for (let i = 1; i < LANCZOS.length; i++) sum += LANCZOS[i] / (z + i);
  const t = z + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

/** Continued fraction of the incomplete beta function (modified Lentz). */
function betaFraction(a: number, b: number, x: number): number {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 300; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const step = d * c;
    h *= step;
    if (Math.abs(step - 1) < 1e-15) break;
  }
  return h;
}

/** The regularized incomplete beta function I_x(a, b). */
export function incompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log(1 - x));
  // The fraction converges fast for x below (a + 1)/(a + b + 2); above it, use the symmetry.
  return x < (a + 1) / (a + b + 2)
    ? (front * betaFraction(a, b, x)) / a
    : 1 - (front * betaFraction(b, a, 1 - x)) / b;
}

/** P(T ≤ t) for Student's t with `dof` degrees of freedom. */
export function studentTCdf(t: number, dof: number): number {
  const tail = 0.5 * incompleteBeta(dof / (dof + t * t), dof / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/** The t value with P(T ≤ t) = p (0.5 ≤ p < 1), by bisection to 1e-12 relative. */
export function studentTQuantile(p: number, dof: number): number {
  if (!(dof > 0)) throw new Error('Student’s t needs at least one degree of freedom');
  if (!(p >= 0.5 && p < 1)) throw new Error('p must be at least 0.5 and below 1');
  let lo = 0;
  let hi = 1;
  while (studentTCdf(hi, dof) < p) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (studentTCdf(mid, dof) < p) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

// ——— the line ———

export type TrendPoint = { x: number; y: number };

export type LineFit = {
  n: number;
  slope: number;
  intercept: number;
  xMean: number;
  sxx: number;
  /** Residual standard error s (n − 2 degrees of freedom); null with two points. */
  residualSE: number | null;
  /** t(0.975, n − 2); null with two points. */
  t975: number | null;
};

/** Least squares through the points; null with fewer than two points or all at one x. */
export function fitLine(points: readonly TrendPoint[]): LineFit | null {
  const n = points.length;
  if (n < 2) return null;
  const xMean = points.reduce((s, p) => s + p.x, 0) / n;
  const yMean = points.reduce((s, p) => s + p.y, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (const p of points) {
    sxx += (p.x - xMean) ** 2;
    sxy += (p.x - xMean) * (p.y - yMean);
  }
  if (!(sxx > 0)) return null;
  const slope = sxy / sxx;
  const intercept = yMean - slope * xMean;
  if (n === 2) return { n, slope, intercept, xMean, sxx, residualSE: null, t975: null };
  let sse = 0;
  for (const p of points) sse += (p.y - intercept - slope * p.x) ** 2;
  return {
    n,
    slope,
    intercept,
    xMean,
    sxx,
    residualSE: Math.sqrt(sse / (n - 2)),
    t975: studentTQuantile(0.975, n - 2),
  };
}

export const lineAt = (f: LineFit, x: number) => f.intercept + f.slope * x;

/** Half the width of the 95 % prediction interval of a new reading at x; null with two points. */
export function predictionHalfWidth(f: LineFit, x: number): number | null {
  if (f.residualSE === null || f.t975 === null) return null;
  return f.t975 * f.residualSE * Math.sqrt(1 + 1 / f.n + (x - f.xMean) ** 2 / f.sxx);
}

/** Which way the limit lies: a diameter falls to its minimum, a clearance rises to its maximum. */
export type LimitSide = 'below' | 'above';

/** Where the line reaches the limit; null when it runs away from it (or flat). */
export function lineReaches(f: LineFit, limit: number, side: LimitSide): number | null {
  const toward = side === 'below' ? f.slope < 0 : f.slope > 0;
  return toward ? (limit - f.intercept) / f.slope : null;
}

/**
 * The first x from `fromX` on where the prediction interval's bound on the limit's side reaches the limit:
 * the cautious projection. `fromX` itself when the bound is already there; null with two points or a line
 * running away from the limit. Between `fromX` and the line's own crossing the bound (the line minus or
 * plus a convex term) crosses the limit once, so bisection finds it.
 */
export function boundReaches(f: LineFit, limit: number, side: LimitSide, fromX: number): number | null {
  const line = lineReaches(f, limit, side);
  if (line === null || predictionHalfWidth(f, fromX) === null) return null;
  const past = (x: number) => {
    const bound =
      side === 'below'
        ? lineAt(f, x) - predictionHalfWidth(f, x)!
        : lineAt(f, x) + predictionHalfWidth(f, x)!;
    return side === 'below' ? bound <= limit : bound >= limit;
  };
  if (line <= fromX || past(fromX)) return Math.min(line, fromX);
  let lo = fromX;
  let hi = line;
  for (let i = 0; i < 200 && hi - lo > 1e-9 * Math.max(1, Math.abs(hi)); i++) {
    const mid = (lo + hi) / 2;
    if (past(mid)) hi = mid;
    else lo = mid;
  }
  return hi;
}

// ——— a wear quantity's projection ———

export type WearReading = { on: string; valueM: number; cycles: number | null };

export type WearProjectionInput = {
  quantity: 'pin_diameter' | 'clearance';
  readings: readonly WearReading[];
  /** Minimum diameter or maximum clearance, m; null when the design gives none. */
  limitM: number | null;
  today: string;
  nextInspectionOn: string | null;
  /** Logged ride cycles turned into the calendar day they are reached (past or projected); null if unknown. */
  dayAtCycles?: (cycles: number) => string | null;
};

/**
 * Wear does not run backwards: a reading farther from the limit than the one before by more than this
 * share of the series' first distance to the limit means the part was renewed or reworked, and the trend
 * starts again from it (measurement scatter is far smaller). Our own rule, stated where trends are shown.
 */
export const RENEWAL_SHARE = 0.2;

/** The readings since the last renewal (see RENEWAL_SHARE), in date order. */
export function sinceRenewal<T extends { valueM: number }>(
  sorted: readonly T[],
  limit: number | null,
  side: LimitSide,
): T[] {
  if (limit === null) return [...sorted];
  let start = 0;
  for (let i = 1; i < sorted.length; i++) {
    const away =
      side === 'below' ? sorted[i].valueM - sorted[i - 1].valueM : sorted[i - 1].valueM - sorted[i].valueM;
    if (away > RENEWAL_SHARE * Math.abs(limit - sorted[start].valueM)) start = i;
  }
  return sorted.slice(start);
}

/** Days before the cautious date at which to suggest an inspection (never before today). */
export const SUGGEST_DAYS_BEFORE = 14;

/** The projection of one wear quantity (features/pivot-life/schema.ts `WearTrend`). */
export type WearProjection = {
  quantity: 'pin_diameter' | 'clearance';
  limitM: number | null;
  points: { on: string; valueM: number; cycles: number | null }[];
  slopePerDay: number | null;
  slopePer1000Cycles: number | null;
  projectedOn: string | null;
  earliestOn: string | null;
  projectedByCyclesOn: string | null;
  nextInspectionOn: string | null;
  flagged: boolean;
  suggestedOn: string | null;
};

/** The day a crossing falls in; a crossing a rounding error short of midnight counts as that midnight. */
const wholeDays = (x: number) => Math.floor(x + 1e-6);

const earlier = (a: string | null, b: string | null) => (a === null ? b : b === null ? a : a < b ? a : b);

/**
 * Least squares over the readings since the last renewal (`points` are those), against days from the first
 * of them and against logged cycles; the dates where the line and the 95 % bound reach the limit, searched
 * from the latest reading on. Flagged when the earliest of the cautious date (the line's own when two
 * readings leave no interval) and the by-cycles date falls on or before the next scheduled inspection; the
 * suggested inspection is SUGGEST_DAYS_BEFORE days before it, never before today.
 */
export function projectWear(input: WearProjectionInput): WearProjection {
  const side: LimitSide = input.quantity === 'pin_diameter' ? 'below' : 'above';
  const readings = sinceRenewal(
    [...input.readings].sort((a, b) => (a.on < b.on ? -1 : a.on > b.on ? 1 : 0)),
    input.limitM,
    side,
  );
  const first = readings[0]?.on;
  const byDay = first ? fitLine(readings.map((r) => ({ x: daysBetween(first, r.on), y: r.valueM }))) : null;
  const counted = readings.filter((r): r is WearReading & { cycles: number } => r.cycles !== null);
  const byCycles = fitLine(counted.map((r) => ({ x: r.cycles, y: r.valueM })));
  const limit = input.limitM;

  let projectedOn: string | null = null;
  let earliestOn: string | null = null;
  let projectedByCyclesOn: string | null = null;
  if (limit !== null && byDay && first) {
    const lastX = daysBetween(first, readings[readings.length - 1].on);
    const x = lineReaches(byDay, limit, side);
    const xb = boundReaches(byDay, limit, side, lastX);
    if (x !== null) projectedOn = addDays(first, wholeDays(x));
    if (xb !== null) earliestOn = addDays(first, wholeDays(xb));
  }
  if (limit !== null && byCycles && input.dayAtCycles) {
    const c = lineReaches(byCycles, limit, side);
    if (c !== null) projectedByCyclesOn = input.dayAtCycles(c);
  }
  const cautious = earlier(earliestOn ?? projectedOn, projectedByCyclesOn);
  const next = input.nextInspectionOn;
  const flagged = cautious !== null && next !== null && cautious <= next;
  const suggested = cautious === null ? null : addDays(cautious, -SUGGEST_DAYS_BEFORE);
  return {
    quantity: input.quantity,
    limitM: limit,
    points: readings.map((r) => ({ on: r.on, valueM: r.valueM, cycles: r.cycles })),
    slopePerDay: byDay?.slope ?? null,
    slopePer1000Cycles: byCycles ? byCycles.slope * 1000 : null,
    projectedOn,
    earliestOn,
    projectedByCyclesOn,
    nextInspectionOn: next,
    flagged,
    suggestedOn: flagged && suggested !== null ? (suggested < input.today ? input.today : suggested) : null,
  };
}
