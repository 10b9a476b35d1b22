/**
 * A free rigid pendulum integrated by the engine (profile { kind: 'free' }) against its exact solution.
 *
 * Source: the free swing of a rigid body about a fixed pin, standard in any dynamics textbook (e.g.
 * Meriam & Kraige, Engineering Mechanics: Dynamics, rigid-body plane kinetics; recalled from memory):
 * I_O·θ̈ = −m·g·r_G·sinθ with θ from hanging; released from rest at ±A the period is
 * T = 4·√(I_O/(m·g·r_G))·K(k), k = sin(A/2), K the complete elliptic integral of the first kind, computed
 * by the arithmetic–geometric mean K = π/(2·AGM(1, √(1 − k²))); by energy ω² = 2·m·g·r_G·(cosθ − cosA)/I_O,
 * so at the bottom the pin carries m·g + m·r_G·ω² straight up. Over the top (bottom rate ω_b above
 * 2·ω_0, ω_0² = m·g·r_G/I_O): one turn takes 4·K(2·ω_0/ω_b)/ω_b.
 */
import {
  type ChainBody,
  FREE_MOTION_RTOL,
  analyseCycle,
  chainEnergy,
  createChain,
} from '@/features/loads/engine';

const g = 9.80665;
const deg = Math.PI / 180;
const HANGING = -Math.PI / 2;

function agm(a: number, b: number): number {
  for (let i = 0; i < 40 && Math.abs(a - b) > 1e-16 * a; i++) [a, b] = [(a + b) / 2, Math.sqrt(a * b)];
  return a;
}
/** Complete elliptic integral of the first kind, modulus k. */
const ellipticK = (k: number) => Math.PI / (2 * agm(1, Math.sqrt(1 - k * k)));

// Invented compound pendulum: a 2 t swing body, centre 4 m below the pin, its own inertia 3,000 kg·m².
const m = 2000;
const r = 4;
const IG = 3000;
const IO = IG + m * r * r;
const body: ChainBody = { name: 'swing body', massKg: m, cgM: [r, 0], inertiaCgKgM2: IG };
const exactPeriod = (A: number) => 4 * Math.sqrt(IO / (m * g * r)) * ellipticK(Math.sin(A / 2));

function energyDrift(bodies: ChainBody[], result: ReturnType<typeof analyseCycle>) {
  const chain = createChain(bodies, g);
  const at = (k: number) =>
    chainEnergy(
      chain,
      result.joints.map((j) => j.angleRad[k]),
      result.joints.map((j) => j.rateRadS[k]),
    ).totalJ;
  const e0 = at(0);
  let worst = 0;
  for (let k = 0; k < result.samples; k++) worst = Math.max(worst, Math.abs(at(k) - e0));
  return worst;
}

test('K by the AGM matches the tabulated K(sin 45°) = 1.8540746773 (Abramowitz & Stegun, table 17.1; from memory)', () => {
  expect(ellipticK(Math.SQRT1_2)).toBeCloseTo(1.8540746773013719, 12);
  expect(ellipticK(0)).toBeCloseTo(Math.PI / 2, 15);
});

describe.each([5, 30, 60, 90, 110, 120, 150, 170])('released from rest at %i°', (amplitudeDeg) => {
  const A = amplitudeDeg * deg;
  // 361 samples over one period put sample 90 at T/4: the bottom of the swing, by symmetry.
  const result = analyseCycle({
    bodies: [body],
    profiles: [{ kind: 'free', angleRad: HANGING + A }],
    gravityMS2: g,
    samples: 361,
  });
  const joint = result.joints[0];
  const T = exactPeriod(A);

  it('the cycle is one period, 4·√(I_O/(m·g·r))·K(sin(A/2)), to 1e-7', () => {
    expect(Math.abs(result.durationS - T) / T).toBeLessThan(1e-7);
    expect(joint.freePeriodS).toBe(result.durationS);
    const note = result.warnings.find((w) => w.code === 'free-period');
    expect(note).toMatchObject({ level: 'info', joint: 0 });
    expect(note?.message).toContain(`period ${Number(T.toPrecision(3))} s found by integration`);
    // It ends where it started: at rest at +A.
    expect(joint.angleRad[360] - HANGING).toBeCloseTo(A, 7);
    expect(joint.rateRadS[360]).toBeCloseTo(0, 6);
    expect(joint.amplitudeRad).toBeCloseTo(A, 6);
  });

  it('at the bottom the pin carries m·g + m·r·ω² straight up, ω² from energy', () => {
    const omega2 = (2 * m * g * r * (1 - Math.cos(A))) / IO;
    const expected = m * g + m * r * omega2;
    expect(joint.angleRad[90]).toBeCloseTo(HANGING, 6);
    expect(joint.rateRadS[90]).toBeCloseTo(-Math.sqrt(omega2), 7);
    // 1e-6: the sample at T/4 is the bottom to within the period's own error.
    expect(Math.abs(joint.forceYN[90] - expected) / expected).toBeLessThan(1e-6);
    expect(Math.abs(joint.forceXN[90]) / expected).toBeLessThan(1e-6);
    // The bottom is where the pin force peaks.
    expect(Math.abs(joint.peakForce.value - expected) / expected).toBeLessThan(1e-6);
  });

  it('torque on the free pin is 0 throughout and energy stays constant', () => {
    const scale = m * g * r;
    // Reported as 0; what inverse dynamics finds on the pin from the integrated motion is round-off.
    for (const t of joint.torqueNm) expect(t).toBe(0);
    expect(joint.freeTorqueResidualNm ?? Infinity).toBeLessThan(1e-9 * scale);
    // Achieved with rtol = atol = 1e-9: about 1e-8 of m·g·r at worst; the stated bound is 1e-7.
    expect(FREE_MOTION_RTOL).toBe(1e-9);
    expect(energyDrift([body], result)).toBeLessThan(1e-7 * scale);
  });
});

test('released from −A: the same period, moving off the other way (the period rule is symmetric)', () => {
  const A = 120 * deg;
  const result = analyseCycle({ bodies: [body], profiles: [{ kind: 'free', angleRad: HANGING - A }] });
  expect(Math.abs(result.durationS - exactPeriod(A)) / exactPeriod(A)).toBeLessThan(1e-7);
  expect(result.joints[0].rateRadS[1]).toBeGreaterThan(0);
});

test('over the top: one turn takes 4·K(2ω₀/ω_b)/ω_b (textbook), reported as a turn', () => {
  const omega0 = Math.sqrt((m * g * r) / IO);
  const wb = 3 * omega0;
  const result = analyseCycle({
    bodies: [body],
    profiles: [{ kind: 'free', angleRad: HANGING, rateRadS: wb }],
    gravityMS2: g,
    samples: 361,
  });
  const T = (4 * ellipticK((2 * omega0) / wb)) / wb;
  expect(Math.abs(result.durationS - T) / T).toBeLessThan(1e-7);
  const joint = result.joints[0];
  expect(joint.angleRad[result.samples - 1] - joint.angleRad[0]).toBeCloseTo(2 * Math.PI, 7);
  expect(joint.amplitudeRad).toBeNull();
  expect(result.warnings[0].message).toMatch(/^Free rotation \(swing body\): one turn takes/);
  // Half a turn later it is over the top, slowest: ω_top² = ω_b² − 4ω₀².
  expect(joint.angleRad[180]).toBeCloseTo(HANGING + Math.PI, 7);
  expect(joint.rateRadS[180]).toBeCloseTo(Math.sqrt(wb * wb - 4 * omega0 * omega0), 7);
});

test('demo pendulum class (domain notes) ±110°: pivot load at the bottom ≈ 3.4 × static, rider ≈ 3.9 g [mem + own calculation]', () => {
  // Pivot to gondola centre 15 m; a 6 t uniform arm (slender rod, I_G = mL²/12); gondola with riders
  // 10 t as a point at 15 m. The rider sits at the gondola, spine toward the pivot.
  const L = 15;
  const bodies: ChainBody[] = [
    { name: 'arm', massKg: 6000, cgM: [L / 2, 0], inertiaCgKgM2: (6000 * L * L) / 12, tipM: [L, 0] },
    { name: 'gondola', massKg: 10_000, cgM: [0, 0], inertiaCgKgM2: 0 },
  ];
  const result = analyseCycle({
    bodies,
    profiles: [
      { kind: 'free', angleRad: HANGING + 110 * deg },
      { kind: 'fixed', angleRad: 0 },
    ],
    gravityMS2: g,
    samples: 361,
    seats: [{ name: 'rider', body: 1, positionM: [0, 0], spineAngleRad: Math.PI }],
  });
  const staticLoad = 16_000 * g;
  const bottom = result.joints[0].forceYN[90];
  expect(bottom / staticLoad).toBeCloseTo(3.4, 1);
  expect(result.seats[0].gz[90]).toBeCloseTo(3.9, 1);
  // And exactly: Σm·r = 195,000 kg·m, I_O = 6000·15²/3 + 10,000·15² = 2.7e6 kg·m².
  const omega2 = (2 * g * 195_000 * (1 - Math.cos(110 * deg))) / 2.7e6;
  expect(bottom).toBeCloseTo(staticLoad + 195_000 * omega2, 0);
  expect(result.seats[0].gz[90]).toBeCloseTo((g + L * omega2) / g, 6);
  expect(result.joints[1].torqueNm.every((t) => Number.isFinite(t))).toBe(true);
  expect(Math.max(...result.joints[0].torqueNm.map(Math.abs))).toBe(0);
  expect(result.joints[0].freeTorqueResidualNm ?? Infinity).toBeLessThan(1e-9 * staticLoad * L);
});

test('a harmonic swing with the free swing’s amplitude and period under-estimates the bottom pin force by about 11 % at 110° (closed forms both ways)', () => {
  // Demo pendulum class again, as one body: Σm·r = 195,000 kg·m, I_O = 2.7e6 kg·m², 16 t.
  const rG = 195_000 / 16_000;
  const bodyOf: ChainBody = {
    name: 'pendulum',
    massKg: 16_000,
    cgM: [rG, 0],
    inertiaCgKgM2: 2.7e6 - 16_000 * rG * rG,
  };
  const A = 110 * deg;
  const free = analyseCycle({
    bodies: [bodyOf],
    profiles: [{ kind: 'free', angleRad: HANGING + A }],
    gravityMS2: g,
  });
  const T = free.durationS;
  expect(T).toBeCloseTo(4 * Math.sqrt(2.7e6 / (195_000 * g)) * ellipticK(Math.sin(A / 2)), 6);
  const harmonic = analyseCycle({
    bodies: [bodyOf],
    profiles: [{ kind: 'swing', amplitudeRad: A, periodS: T, centreRad: HANGING }],
    gravityMS2: g,
  });
  // Harmonic: at the bottom q̇ = A·2π/T and q̈ = 0, so the pin carries m·g + Σm·r·(2πA/T)².
  const harmonicBottom = 16_000 * g + 195_000 * ((2 * Math.PI * A) / T) ** 2;
  const freeBottom = 16_000 * g + (195_000 * 2 * g * 195_000 * (1 - Math.cos(A))) / 2.7e6;
  expect(harmonic.joints[0].peakForce.value).toBeCloseTo(harmonicBottom, 0);
  expect(free.joints[0].peakForce.value / freeBottom).toBeCloseTo(1, 4);
  const shortfall = 1 - harmonicBottom / freeBottom;
  expect(shortfall).toBeGreaterThan(0.09);
  expect(shortfall).toBeLessThan(0.13);
  // And the harmonic model asks a free pin for a drive torque.
  expect(Math.abs(harmonic.joints[0].peakTorque.value)).toBeGreaterThan(1e5);
});
