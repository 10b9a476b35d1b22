/**
 * The calculator's form model: typed strings in display units → the engine's request → result.
 * Reference values: uniform slender rod driven at constant speed in a vertical plane (standard
 * rigid-body result, e.g. Meriam & Kraige, Dynamics; from memory): peak pin force mg + m·ω²·L/2.
 */
import { rodDesign } from '@/tests/support/rod-design';
import {
  type MotionRow,
  manualRequest,
  motionRowFromDesign,
  rideRequest,
  newMotion,
  profileFromRow,
  runCalculator,
  stopsFromRows,
} from '@/features/calculator/calculator-model';

const g = 9.80665;
const motion = (patch: Partial<MotionRow>): MotionRow => ({ ...newMotion(), ...patch });

test('a rod typed in by hand, turning steadily, peaks at mg + mω²L/2 (textbook)', () => {
  const m = 200;
  const L = 4;
  const rpm = 12;
  const w = (rpm * 2 * Math.PI) / 60;
  const out = runCalculator(
    manualRequest(
      [
        {
          name: 'Rod',
          massKg: String(m),
          cgX: String(L / 2),
          cgY: '0',
          inertia: String((m * L * L) / 12),
          tipX: '',
          tipY: '',
        },
      ],
      [motion({ kind: 'constant', rpm: String(rpm) })],
    ),
  );
  if (!out.ok) throw new Error(JSON.stringify(out.issues));
  expect(out.xAxis).toBe('angle');
  const exact = m * g + (m * w * w * L) / 2;
  expect(out.result.joints[0].peakForce.value).toBeGreaterThan(exact * (1 - 1e-4));
  expect(out.result.joints[0].peakForce.value).toBeLessThanOrEqual(exact * (1 + 1e-9));
});

test('degrees typed for a swing become radians for the engine', () => {
  const p = profileFromRow(motion({ kind: 'swing', amplitudeDeg: '90', periodS: '6' }));
  expect(p).toEqual({ profile: { kind: 'swing', amplitudeRad: Math.PI / 2, periodS: 6 }, issues: [] });
});

test('an empty or non-numeric field is reported on its own path, not read as zero', () => {
  const out = runCalculator(
    manualRequest(
      [
        { name: 'Arm', massKg: '', cgX: '1', cgY: '0', inertia: '10', tipX: '2', tipY: '0' },
        { name: 'Cab', massKg: 'abc', cgX: '0', cgY: '-1', inertia: '5', tipX: '', tipY: '' },
      ],
      [motion({ kind: 'constant', rpm: '5' }), motion({})],
    ),
  );
  expect(out.ok).toBe(false);
  if (!out.ok) {
    const paths = out.issues.map((i) => i.path);
    expect(paths).toContain('bodies.0.massKg');
    expect(paths).toContain('bodies.1.massKg');
  }
});

test('a missing next pivot on an inner body is named', () => {
  const out = runCalculator(
    manualRequest(
      [
        { name: 'Arm', massKg: '10', cgX: '1', cgY: '0', inertia: '10', tipX: '', tipY: '' },
        { name: 'Cab', massKg: '5', cgX: '0', cgY: '-1', inertia: '5', tipX: '', tipY: '' },
      ],
      [motion({ kind: 'constant', rpm: '5' }), motion({})],
    ),
  );
  expect(out.ok).toBe(false);
  if (!out.ok) expect(out.issues.map((i) => i.path)).toContain('bodies.0.tipM');
});

// ——— issue 13: free swings, measured records, stops ———

/** A uniform rod of mass m and length L pinned at one end, typed in as the calculator's one body. */
const rodRow = (m: number, L: number) => ({
  name: 'Rod',
  massKg: String(m),
  cgX: String(L / 2),
  cgY: '0',
  inertia: String((m * L * L) / 12),
  tipX: '',
  tipY: '',
});

/** Complete elliptic integral of the first kind by the arithmetic–geometric mean (Abramowitz & Stegun 17.6). */
function ellipticK(k: number): number {
  let a = 1;
  let b = Math.sqrt(1 - k * k);
  while (Math.abs(a - b) > 1e-15 * a) [a, b] = [(a + b) / 2, Math.sqrt(a * b)];
  return Math.PI / (2 * a);
}

/** A small seeded generator (mulberry32) and Gaussian noise by Box–Muller, so the noisy record is fixed. */
function gaussian(seed: number) {
  let s = seed >>> 0;
  const uniform = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

test('a free rod let go 120° from hanging: the exact period and the pin force at the bottom (textbook)', () => {
  const m = 300;
  const L = 6;
  const r = L / 2;
  const I_O = (m * L * L) / 3;
  const A = (120 * Math.PI) / 180;
  // The joint angle is from the horizontal, so hanging is −90° and 120° from hanging is +30°.
  const out = runCalculator(manualRequest([rodRow(m, L)], [motion({ kind: 'free', angleDeg: '30' })]));
  if (!out.ok) throw new Error(JSON.stringify(out.issues));
  // Physical pendulum, exact: T = 4·√(I_O/(m·g·r))·K(sin(A/2)) (any dynamics textbook).
  const period = 4 * Math.sqrt(I_O / (m * g * r)) * ellipticK(Math.sin(A / 2));
  const j = out.result.joints[0];
  expect(j.freePeriodS).toBeDefined();
  expect(Math.abs((j.freePeriodS as number) - period) / period).toBeLessThan(1e-6);
  expect(out.result.durationS).toBeCloseTo(period, 5);
  // The period found is reported with the result as a note.
  expect(out.result.warnings.some((w) => w.level === 'info' && w.joint === 0)).toBe(true);
  // At the bottom: F = m·g + m·r·ω², ω² = 2·m·g·r·(1 − cos A)/I_O by energy; for a uniform rod the
  // largest force over the swing is there (the tangential term is m·g·sin θ·(1 − m·r²/I_O), small).
  const w2 = (2 * m * g * r * (1 - Math.cos(A))) / I_O;
  const bottom = m * g + m * r * w2;
  expect(Math.abs(j.peakForce.value - bottom) / bottom).toBeLessThan(1e-4);
  // A free pin carries no torque.
  expect(Math.max(...Array.from(j.torqueNm, Math.abs))).toBeLessThan(1e-6 * bottom * L);
});

test('a start rate for a free joint is typed in °/s and reaches the engine in rad/s', () => {
  const p = profileFromRow(motion({ kind: 'free', angleDeg: '-90', startRateDegS: '90' }));
  expect(p.profile).toEqual({ kind: 'free', angleRad: -Math.PI / 2, rateRadS: Math.PI / 2 });
  expect(profileFromRow(motion({ kind: 'free', angleDeg: '10' })).profile).toEqual({
    kind: 'free',
    angleRad: (10 * Math.PI) / 180,
  });
});

/**
 * A harmonic swing q(t) = A·sin(2πt/T) of a hanging rod (θ = q from hanging) and its exact pin force:
 * F = m·(a_G − g) with a_G's radial part r·q̇² and tangential part r·q̈ (fixed-axis kinetics, e.g. Meriam &
 * Kraige, Dynamics; from memory). |F|² = m²[(g·cos q + r·q̇²)² + (r·q̈ + g·sin q)²], maximised on a fine grid.
 */
function swingTruth(m: number, r: number, A: number, T: number) {
  const w = (2 * Math.PI) / T;
  let peak = 0;
  for (let k = 0; k <= 200_000; k++) {
    const t = (k / 200_000) * T;
    const q = A * Math.sin(w * t);
    const qd = A * w * Math.cos(w * t);
    const qdd = -A * w * w * Math.sin(w * t);
    peak = Math.max(peak, m * Math.hypot(g * Math.cos(q) + r * qd * qd, r * qdd + g * Math.sin(q)));
  }
  return peak;
}

/** A record as a logger writes it: a header, then time and the value to a fixed number of decimals. */
const csv = (rows: [number, number][], header = 'time_s,angle_deg') =>
  [header, ...rows.map(([t, v]) => `${t.toFixed(3)},${v.toFixed(4)}`)].join('\n');

test('a measured angle record of a swing, pasted as CSV, gives the exact peak pin force within 3 %', () => {
  const m = 400;
  const L = 8;
  const A = (40 * Math.PI) / 180;
  const T = 5;
  const rows: [number, number][] = [];
  for (let k = 0; k <= 2 * T * 100; k++) {
    const t = k / 100;
    // Joint angle from the horizontal: hanging is −90°.
    rows.push([t, -90 + (A * 180 * Math.sin((2 * Math.PI * t) / T)) / Math.PI]);
  }
  const truth = swingTruth(m, L / 2, A, T);
  const out = runCalculator(
    manualRequest(
      [rodRow(m, L)],
      [motion({ kind: 'measured', recordText: csv(rows), recordColumn: 'angle_deg' })],
    ),
  );
  if (!out.ok) throw new Error(JSON.stringify(out.issues));
  expect(out.xAxis).toBe('time');
  // The issue's accuracy target for measured records at default settings: within 3 % of the truth.
  expect(Math.abs(out.result.joints[0].peakForce.value - truth) / truth).toBeLessThan(0.03);
});

test('the same record with seeded noise of 0.05° at 100 Hz, smoothed automatically, stays within 3 %', () => {
  const m = 400;
  const L = 8;
  const A = (40 * Math.PI) / 180;
  const T = 5;
  const noise = gaussian(13);
  const rows: [number, number][] = [];
  for (let k = 0; k <= 2 * T * 100; k++) {
    const t = k / 100;
    rows.push([t, -90 + (A * 180 * Math.sin((2 * Math.PI * t) / T)) / Math.PI + 0.05 * noise()]);
  }
  const truth = swingTruth(m, L / 2, A, T);
  const out = runCalculator(
    manualRequest([rodRow(m, L)], [motion({ kind: 'measured', recordText: csv(rows) })]),
  );
  if (!out.ok) throw new Error(JSON.stringify(out.issues));
  expect(Math.abs(out.result.joints[0].peakForce.value - truth) / truth).toBeLessThan(0.03);
  // The smoothing actually used comes back with the result, to be shown beside it.
  expect(out.result.warnings).toContainEqual(
    expect.objectContaining({ code: 'smoothing', joint: 0, level: 'info' }),
  );
});

test('a rate record in rpm of a steady turn gives m·g + m·ω²·L/2 (textbook), a typed cut-off reaches the engine', () => {
  const m = 200;
  const L = 4;
  const rpm = 12;
  const w = (rpm * 2 * Math.PI) / 60;
  const rows: [number, number][] = Array.from({ length: 501 }, (_, k) => [k / 50, rpm]);
  const row = motion({
    kind: 'measured',
    recordText: csv(rows, 'time;rate').replace(/,/g, ';'),
    recordColumn: 'rate_rpm',
    smoothing: 'cutoff',
    cutoffHz: '2',
  });
  const { profile } = profileFromRow(row);
  expect(profile).toMatchObject({ kind: 'measured', cutoffHz: 2 });
  if (profile?.kind !== 'measured') throw new Error('not measured');
  expect(profile.rateRadS?.[0]).toBeCloseTo(w, 12);
  expect(profile.timeS).toHaveLength(501);
  const out = runCalculator(manualRequest([rodRow(m, L)], [row]));
  if (!out.ok) throw new Error(JSON.stringify(out.issues));
  const exact = m * g + (m * w * w * L) / 2;
  expect(Math.abs(out.result.joints[0].peakForce.value - exact) / exact).toBeLessThan(1e-3);
});

test('a bad line in a record is named by line on its joint; other problems still show, none about the placeholder', () => {
  const out = runCalculator(
    manualRequest(
      [
        { name: 'Arm', massKg: '', cgX: '1', cgY: '0', inertia: '10', tipX: '2', tipY: '0' },
        { name: 'Cab', massKg: '5', cgX: '0', cgY: '-1', inertia: '5', tipX: '', tipY: '' },
      ],
      [
        motion({ kind: 'fixed' }),
        motion({ kind: 'measured', recordText: 't,a\n0,1\n0.1,2\n0.2,x\n0.3,4\n0.4,5\n0.5,6\n' }),
      ],
    ),
  );
  expect(out.ok).toBe(false);
  if (out.ok) return;
  expect(out.issues).toContainEqual({
    path: 'profiles.1.record',
    message: expect.stringMatching(/^Line 4 /),
  });
  expect(out.issues.map((i) => i.path)).toContain('bodies.0.massKg');
  expect(out.issues.map((i) => i.path)).not.toContain('durationS');
  // An empty record or a missing cut-off is asked for, not guessed.
  const empty = runCalculator(
    manualRequest([rodRow(10, 1)], [motion({ kind: 'measured', smoothing: 'cutoff' })]),
  );
  expect(empty.ok).toBe(false);
  if (!empty.ok)
    expect(empty.issues.map((i) => i.path)).toEqual(expect.arrayContaining(['profiles.0.record']));
});

test('an emergency stop from steady rotation peaks at m·(g + r·√(ω⁴ + α²)) (fixed-axis kinetics)', () => {
  const m = 200;
  const L = 4;
  const r = L / 2;
  const rpm = 12;
  const alpha = 0.8;
  const w = (rpm * 2 * Math.PI) / 60;
  const out = runCalculator(
    manualRequest(
      [rodRow(m, L)],
      [motion({ kind: 'constant', rpm: String(rpm), emergencyStop: String(alpha) })],
    ),
  );
  if (!out.ok) throw new Error(JSON.stringify(out.issues));
  expect(out.cases?.cases.map((c) => c.kind)).toEqual(['operating', 'emergency_stop']);
  const [operating, stop] = out.cases!.cases;
  // Running: m·g + m·ω²·r. Braking at full speed: the tangential m·r·α adds to the centripetal m·r·ω² at
  // right angles, and the weight lines up with their sum at the worst arm angle.
  expect(operating.joints[0].peakForceN / (m * g + m * w * w * r)).toBeCloseTo(1, 6);
  const exact = m * (g + r * Math.hypot(w * w, alpha));
  expect(Math.abs(stop.joints[0].peakForceN - exact) / exact).toBeLessThan(1e-3);
  // The braking torque is I_O·α (the weight's moment comes on top, at the worst angle at most m·g·r).
  const I_O = (m * L * L) / 3;
  expect(Math.abs(stop.joints[0].peakTorqueNm)).toBeGreaterThanOrEqual(I_O * alpha * (1 - 1e-3));
  expect(Math.abs(stop.joints[0].peakTorqueNm)).toBeLessThanOrEqual((I_O * alpha + m * g * r) * (1 + 1e-3));
});

test('stop decelerations are checked: positive, within reach, never on a held joint; none means no cases', () => {
  const rows = [
    motion({ kind: 'constant', rpm: '5', serviceStop: '-1', emergencyStop: '2000' }),
    motion({ kind: 'fixed', serviceStop: '1' }),
  ];
  expect(stopsFromRows(rows).issues.map((i) => i.path)).toEqual([
    'profiles.0.serviceDecelRadS2',
    'profiles.0.emergencyDecelRadS2',
    'profiles.1.serviceDecelRadS2',
  ]);
  expect(stopsFromRows([motion({ kind: 'swing', serviceStop: '0,5' })]).stops).toEqual([
    { joint: 0, serviceDecelRadS2: 0.5 },
  ]);
  const plain = runCalculator(manualRequest([rodRow(10, 1)], [motion({ kind: 'constant', rpm: '5' })]));
  expect(plain.ok && plain.cases).toBeNull();
});

test('a design that marks a free swing and gives stops is prefilled so: free from rest at its amplitude', () => {
  const row = motionRowFromDesign({
    joint: 0,
    kind: 'swing',
    amplitudeRad: Math.PI / 3,
    periodS: 6,
    freeSwing: true,
    serviceDecelRadS2: 0.4,
    emergencyDecelRadS2: 1.2,
  });
  expect(row).toMatchObject({ kind: 'free', angleDeg: '60', serviceStop: '0.4', emergencyStop: '1.2' });
  expect(motionRowFromDesign({ joint: 0, kind: 'constant', rpm: 8 })).toMatchObject({
    kind: 'constant',
    rpm: '8',
    serviceStop: '',
  });
});

test('a registered ride with an emergency stop in its design data: prefilled, run, and the governing case named', () => {
  // The textbook rod as design data (tests/support/rod-design.ts): 6 rpm, pivot force limit 20 kN.
  const design = rodDesign(200, 4);
  // A generous rate limit, so the force is the line using most of its allowance.
  design.motion[0] = { ...design.motion[0], maxRateRadS: 20, emergencyDecelRadS2: 3 };
  const rows = design.motion.map((m) => motionRowFromDesign(m));
  expect(rows[0].emergencyStop).toBe('3');
  const out = runCalculator(rideRequest(design, rows));
  if (!out.ok) throw new Error(JSON.stringify(out.issues));
  const r = 2;
  const w = (6 * 2 * Math.PI) / 60;
  // Braking at 3 rad/s² adds m·r·α = 1.2 kN at right angles to m·r·ω² (fixed-axis kinetics), so the stop
  // governs the pivot force: m·(g + r·√(ω⁴ + α²)) against m·(g + r·ω²) running.
  const stopForce = 200 * (g + r * Math.hypot(w * w, 3));
  const force = out.result.envelope.find((e) => e.id === 'joints.0.force');
  expect(force?.loadCase).toBe('emergency_stop');
  expect(Math.abs((force?.value ?? 0) - stopForce) / stopForce).toBeLessThan(1e-3);
  expect(out.cases?.governing).toBe('emergency_stop');
  // The rate limit is the operating cycle's: a stop only slows the ride.
  expect(out.result.envelope.find((e) => e.id === 'joints.0.rate')?.loadCase).toBe('operating');
});

test('a record shorter than another joint’s natural cycle is refused until a cycle length is typed', () => {
  const bodies = [
    { name: 'Arm', massKg: '1000', cgX: '2', cgY: '0', inertia: '1300', tipX: '4', tipY: '0' },
    rodRow(100, 2),
  ];
  // The arm at 1 rpm has a 60 s cycle; the gondola's record lasts 10 s.
  const record = csv(Array.from({ length: 501 }, (_, k) => [k / 50, -90 + 5 * Math.sin(k / 50)]));
  const rows = [motion({ kind: 'constant', rpm: '1' }), motion({ kind: 'measured', recordText: record })];
  const refused = runCalculator(manualRequest(bodies, rows));
  expect(refused.ok).toBe(false);
  if (!refused.ok) expect(refused.issues[0].message).toMatch(/longer than the measured record of joint 2/);
  const ran = runCalculator(manualRequest(bodies, rows, '10'));
  if (!ran.ok) throw new Error(JSON.stringify(ran.issues));
  expect(ran.result.durationS).toBe(10);
});
