/**
 * Sensor-like records made from exact motions, and the exact peak pivot force of a uniform rod following
 * them, for the conditioning tests. Kinematics of a rigid body turning about a fixed pin (standard textbook
 * result): a_G = r·(−ω²·cosθ − α·sinθ, −ω²·sinθ + α·cosθ), pin force F = m·(a_G − g⃗). The free swing is
 * integrated from its equation of motion I_O·φ̈ = −m·g·r·sinφ by classical Runge–Kutta (RK4) with a 1 ms
 * step, whose error on these swings is below 1e-9 rad (step⁴ scaling, checked against the elliptic period).
 */
import type { MotionProfile } from '@/features/loads/engine';

export const G = 9.80665;

export type Kinematics = { q: number; w: number; a: number };
export type Motion = { name: string; at: (t: number) => Kinematics };

/** A uniform rod of mass m and length L pinned at one end: r_G = L/2, I_O = m·L²/3. */
export const rodBody = (m: number, L: number) => ({
  name: 'arm',
  massKg: m,
  cgM: [L / 2, 0] as [number, number],
  inertiaCgKgM2: (m * L * L) / 12,
});

/** Seeded uniform [0, 1) (mulberry32) and standard normal (Box–Muller) draws. */
export function random(seed: number) {
  let s = seed >>> 0;
  const uniform = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
  return { uniform, normal };
}

/** q = centre + A·sin(2πt/T + phase); centre −π/2 hangs the rod straight down. */
export function harmonicSwing(A: number, T: number, phase = 0, centre = -Math.PI / 2): Motion {
  const w = (2 * Math.PI) / T;
  return {
    name: `harmonic swing ±${((A * 180) / Math.PI).toFixed(0)}°, ${T.toFixed(2)} s`,
    at: (t) => ({
      q: centre + A * Math.sin(w * t + phase),
      w: A * w * Math.cos(w * t + phase),
      a: -A * w * w * Math.sin(w * t + phase),
    }),
  };
}

/** Steady rotation at `rpm` from `q0`. */
export function steadyRotation(rpm: number, q0 = 0): Motion {
  const w = (rpm * 2 * Math.PI) / 60;
  return { name: `steady ${rpm.toFixed(1)} rpm`, at: (t) => ({ q: q0 + w * t, w, a: 0 }) };
}

/** Linear ramp (constant α) from w0 to w1 over [hold, hold + ramp], steady before and after. */
export function linearRamp(w0: number, w1: number, hold: number, ramp: number, q0 = 0): Motion {
  const alpha = (w1 - w0) / ramp;
  return {
    name: `ramp ${w0.toFixed(2)} → ${w1.toFixed(2)} rad/s over ${ramp.toFixed(1)} s`,
    at: (t) => {
      if (t <= hold) return { q: q0 + w0 * t, w: w0, a: 0 };
      const u = Math.min(t - hold, ramp);
      const q = q0 + w0 * hold + w0 * u + 0.5 * alpha * u * u + w1 * Math.max(0, t - hold - ramp);
      return t < hold + ramp ? { q, w: w0 + alpha * u, a: alpha } : { q, w: w1, a: 0 };
    },
  };
}

/** Free swing of the rod from rest at `A` from hanging, integrated by RK4 (1 ms steps) up to `span`. */
export function freeSwing(L: number, A: number, span: number): Motion {
  const k = (3 * G) / (2 * L); // m·g·r/I_O for the rod
  const h = 1e-3;
  const steps = Math.ceil(span / h) + 2;
  const phi = new Float64Array(steps + 1);
  const rate = new Float64Array(steps + 1);
  phi[0] = A;
  const f = (p: number) => -k * Math.sin(p);
  for (let i = 0; i < steps; i++) {
    const p = phi[i];
    const v = rate[i];
    const k1p = v;
    const k1v = f(p);
    const k2p = v + (h / 2) * k1v;
    const k2v = f(p + (h / 2) * k1p);
    const k3p = v + (h / 2) * k2v;
    const k3v = f(p + (h / 2) * k2p);
    const k4p = v + h * k3v;
    const k4v = f(p + h * k3p);
    phi[i + 1] = p + (h / 6) * (k1p + 2 * k2p + 2 * k3p + k4p);
    rate[i + 1] = v + (h / 6) * (k1v + 2 * k2v + 2 * k3v + k4v);
  }
  return {
    name: `free swing from ${((A * 180) / Math.PI).toFixed(0)}°, rod ${L.toFixed(1)} m`,
    at: (t) => {
      // Quintic Hermite between steps (value, rate and acceleration at both ends): far below sensor noise.
      const i = Math.min(steps - 1, Math.floor(t / h));
      const u = t / h - i;
      const p0 = phi[i];
      const p1 = phi[i + 1];
      const v0 = rate[i] * h;
      const v1 = rate[i + 1] * h;
      const a0 = f(p0) * h * h;
      const a1 = f(p1) * h * h;
      const u2 = u * u;
      const u3 = u2 * u;
      const u4 = u3 * u;
      const u5 = u4 * u;
      const p =
        p0 * (1 - 10 * u3 + 15 * u4 - 6 * u5) +
        v0 * (u - 6 * u3 + 8 * u4 - 3 * u5) +
        a0 * (0.5 * u2 - 1.5 * u3 + 1.5 * u4 - 0.5 * u5) +
        p1 * (10 * u3 - 15 * u4 + 6 * u5) +
        v1 * (-4 * u3 + 7 * u4 - 3 * u5) +
        a1 * (0.5 * u3 - u4 + 0.5 * u5);
      // Rate from energy, ω² = 2k(cosφ − cosA), with the integrated rate's sign; acceleration from the ODE.
      const speed = Math.sqrt(Math.max(0, 2 * k * (Math.cos(p) - Math.cos(A))));
      const sign = rate[i] + (rate[i + 1] - rate[i]) * u >= 0 ? 1 : -1;
      return { q: -Math.PI / 2 + p, w: sign * speed, a: f(p) };
    },
  };
}

/** Peak pin force of a uniform rod (m, L) following `motion` over [0, span], on a 0.5 ms grid. */
export function exactPeakForce(motion: Motion, m: number, L: number, span: number): number {
  const r = L / 2;
  let peak = 0;
  for (let t = 0; t <= span + 1e-12; t += 5e-4) {
    const { q, w, a } = motion.at(Math.min(t, span));
    const c = Math.cos(q);
    const s = Math.sin(q);
    const fx = m * r * (-w * w * c - a * s);
    const fy = m * r * (-w * w * s + a * c) + m * G;
    peak = Math.max(peak, Math.hypot(fx, fy));
  }
  return peak;
}

export type Sensor =
  | { kind: 'angle'; noiseRad: number; wrap?: 'turn' | 'half-turn' }
  | { kind: 'rate'; noiseRadS: number; biasRadS: number };

/**
 * A record of `motion` at `rateHz` over `span` seconds as a sensor would give it: seeded white noise,
 * optional timing jitter (fraction of the interval), angles optionally wrapped to [0, 2π) or (−π, π].
 */
export function record(
  motion: Motion,
  sensor: Sensor,
  rateHz: number,
  span: number,
  seed: number,
  jitter = 0,
): Extract<MotionProfile, { kind: 'measured' }> {
  const rnd = random(seed);
  const n = Math.floor(span * rateHz + 1e-9) + 1;
  const timeS: number[] = [];
  const values: number[] = [];
  for (let k = 0; k < n; k++) {
    const t = k === 0 || k === n - 1 ? k / rateHz : (k + jitter * (rnd.uniform() - 0.5)) / rateHz;
    const m = motion.at(t);
    timeS.push(t);
    if (sensor.kind === 'angle') {
      let q = m.q + sensor.noiseRad * rnd.normal();
      if (sensor.wrap === 'turn') q = q - 2 * Math.PI * Math.floor(q / (2 * Math.PI));
      if (sensor.wrap === 'half-turn') q = q - 2 * Math.PI * Math.round(q / (2 * Math.PI));
      values.push(q);
    } else values.push(m.w + sensor.biasRadS + sensor.noiseRadS * rnd.normal());
  }
  return sensor.kind === 'angle'
    ? { kind: 'measured', timeS, angleRad: values }
    : { kind: 'measured', timeS, rateRadS: values, startAngleRad: motion.at(0).q };
}
