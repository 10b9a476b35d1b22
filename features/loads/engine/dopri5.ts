/**
 * Dormand–Prince 5(4), the embedded Runge–Kutta pair of J. R. Dormand and P. J. Prince, "A family of
 * embedded Runge–Kutta formulae", J. Comp. Appl. Math. 6 (1980), as laid out in E. Hairer, S. P. Nørsett
 * and G. Wanner, "Solving Ordinary Differential Equations I" (2nd ed., 1993), §II.4–II.6 and their
 * DOPRI5 code: seven stages with the last one reused as the next step's first (FSAL), the fifth-order
 * result carried on, the fourth-order one used only to estimate the local error, and a continuous
 * fourth-order extension (dense output) over each accepted step.
 *
 * Error control per step: err = √(mean((e_i / (atol + rtol·max(|y_i|, |y_new,i|)))²)) ≤ 1, the next step
 * h·min(10, max(0.2, 0.9·err^(−1/5))), never grown right after a rejection.
 */

export type OdeRhs = (t: number, y: Float64Array, dydt: Float64Array) => void;

export type Dopri5Options = {
  rtol: number;
  atol: number;
  /** Largest step allowed. */
  hMax?: number;
};

/** One accepted step: the dense output over [t0, t0 + h] is a polynomial with five coefficient blocks. */
export type DenseSegment = { t0: number; h: number; coef: Float64Array };

const C2 = 1 / 5;
const C3 = 3 / 10;
const C4 = 4 / 5;
const C5 = 8 / 9;
const A21 = 1 / 5;
const A31 = 3 / 40;
const A32 = 9 / 40;
const A41 = 44 / 45;
const A42 = -56 / 15;
const A43 = 32 / 9;
const A51 = 19372 / 6561;
const A52 = -25360 / 2187;
const A53 = 64448 / 6561;
const A54 = -212 / 729;
const A61 = 9017 / 3168;
const A62 = -355 / 33;
const A63 = 46732 / 5247;
const A64 = 49 / 176;
const A65 = -5103 / 18656;
const A71 = 35 / 384;
const A73 = 500 / 1113;
const A74 = 125 / 192;
const A75 = -2187 / 6784;
const A76 = 11 / 84;
// Fifth-order weights minus the embedded fourth-order ones.
const E1 = 71 / 57600;
const E3 = -71 / 16695;
const E4 = 71 / 1920;
const E5 = -17253 / 339200;
const E6 = 22 / 525;
const E7 = -1 / 40;
// Dense output (Hairer–Wanner's DOPRI5, after Shampine 1986).
const D1 = -12715105075 / 11282082432;
const D3 = 87487479700 / 32700410799;
const D4 = -10690763975 / 1880347072;
const D5 = 701980252875 / 199316789632;
const D6 = -1453857185 / 822651844;
const D7 = 69997945 / 29380423;

export class Dopri5 {
  readonly dim: number;
  t: number;
  readonly y: Float64Array;
  steps = 0;
  rejected = 0;
  evaluations = 0;
  private h = 0;
  private readonly k1: Float64Array;
  private readonly k2: Float64Array;
  private readonly k3: Float64Array;
  private readonly k4: Float64Array;
  private readonly k5: Float64Array;
  private readonly k6: Float64Array;
  private readonly k7: Float64Array;
  private readonly stage: Float64Array;
  private readonly yNew: Float64Array;

  constructor(
    private readonly f: OdeRhs,
    t0: number,
    y0: ArrayLike<number>,
    private readonly options: Dopri5Options,
  ) {
    this.dim = y0.length;
    this.t = t0;
    this.y = Float64Array.from(y0);
    const vector = () => new Float64Array(this.dim);
    [this.k1, this.k2, this.k3, this.k4, this.k5, this.k6, this.k7] = Array.from({ length: 7 }, vector);
    this.stage = vector();
    this.yNew = vector();
    this.eval(t0, this.y, this.k1);
  }

  private eval(t: number, y: Float64Array, out: Float64Array) {
    this.evaluations++;
    this.f(t, y, out);
  }

  private scaledNorm(v: Float64Array, a: Float64Array, b: Float64Array): number {
    const { rtol, atol } = this.options;
    let sum = 0;
    for (let i = 0; i < this.dim; i++) {
      const sk = atol + rtol * Math.max(Math.abs(a[i]), Math.abs(b[i]));
      sum += (v[i] / sk) ** 2;
    }
    return Math.sqrt(sum / this.dim);
  }

  /** Hairer–Wanner's starting step (§II.4): from the sizes of y, f and an estimate of f's change. */
  private initialStep(tEnd: number): number {
    const { y, dim } = this;
    const f0 = this.k1;
    const d0 = this.scaledNorm(y, y, y);
    const d1 = this.scaledNorm(f0, y, y);
    let h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : 0.01 * (d0 / d1);
    h0 = Math.min(h0, tEnd - this.t, this.options.hMax ?? Infinity);
    for (let i = 0; i < dim; i++) this.stage[i] = y[i] + h0 * f0[i];
    const f1 = this.k2;
    this.eval(this.t + h0, this.stage, f1);
    for (let i = 0; i < dim; i++) this.yNew[i] = f1[i] - f0[i];
    const d2 = this.scaledNorm(this.yNew, y, y) / h0;
    const big = Math.max(d1, d2);
    const h1 = big <= 1e-15 ? Math.max(1e-6, h0 * 1e-3) : (0.01 / big) ** (1 / 5);
    return Math.min(100 * h0, h1, this.options.hMax ?? Infinity);
  }

  /**
   * Takes one accepted step, never past `tEnd`, and returns its dense output (a fresh copy, safe to keep).
   * Throws when the step size collapses (a singular or discontinuous right-hand side).
   */
  step(tEnd: number): DenseSegment {
    const { dim, y, yNew, stage } = this;
    const { k1, k2, k3, k4, k5, k6, k7 } = this;
    if (this.h === 0) this.h = this.initialStep(tEnd);
    let rejectedNow = false;
    for (;;) {
      let h = Math.min(this.h, this.options.hMax ?? Infinity);
      if (this.t + 1.01 * h >= tEnd) h = tEnd - this.t;
      const t = this.t;
      if (!(h > 1e-14 * Math.max(1, Math.abs(t)))) throw new Error(`Step size collapsed at t = ${t}`);
      for (let i = 0; i < dim; i++) stage[i] = y[i] + h * A21 * k1[i];
      this.eval(t + C2 * h, stage, k2);
      for (let i = 0; i < dim; i++) stage[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i]);
      this.eval(t + C3 * h, stage, k3);
      for (let i = 0; i < dim; i++) stage[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i]);
      this.eval(t + C4 * h, stage, k4);
      for (let i = 0; i < dim; i++)
        stage[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i]);
      this.eval(t + C5 * h, stage, k5);
      for (let i = 0; i < dim; i++)
        stage[i] = y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i]);
      this.eval(t + h, stage, k6);
      for (let i = 0; i < dim; i++)
        yNew[i] = y[i] + h * (A71 * k1[i] + A73 * k3[i] + A74 * k4[i] + A75 * k5[i] + A76 * k6[i]);
      this.eval(t + h, yNew, k7);
      for (let i = 0; i < dim; i++)
        stage[i] = h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i]);
      const err = this.scaledNorm(stage, y, yNew);
      const grow = err === 0 ? 10 : Math.min(10, Math.max(0.2, 0.9 * err ** -0.2));
      if (err <= 1) {
        const coef = new Float64Array(5 * dim);
        for (let i = 0; i < dim; i++) {
          const diff = yNew[i] - y[i];
          const bspl = h * k1[i] - diff;
          coef[i] = y[i];
          coef[dim + i] = diff;
          coef[2 * dim + i] = bspl;
          coef[3 * dim + i] = diff - h * k7[i] - bspl;
          coef[4 * dim + i] =
            h * (D1 * k1[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i] + D7 * k7[i]);
        }
        y.set(yNew);
        k1.set(k7);
        this.t = t + h;
        this.steps++;
        this.h = rejectedNow ? Math.min(h, h * grow) : h * grow;
        return { t0: t, h, coef };
      }
      this.rejected++;
      rejectedNow = true;
      this.h = h * Math.max(0.2, grow);
    }
  }
}

/** Component i of the dense output at time t within the segment. */
export function denseValue(seg: DenseSegment, t: number, i: number, dim: number): number {
  const s = (t - seg.t0) / seg.h;
  const s1 = 1 - s;
  const c = seg.coef;
  return c[i] + s * (c[dim + i] + s1 * (c[2 * dim + i] + s * (c[3 * dim + i] + s1 * c[4 * dim + i])));
}

/** The whole state at time t within the segment. */
export function denseState(seg: DenseSegment, t: number, out: Float64Array): void {
  const dim = out.length;
  for (let i = 0; i < dim; i++) out[i] = denseValue(seg, t, i, dim);
}
