import {
  DEFAULT_NEAR_MARGIN,
  ENVELOPE_STATUS_LABEL,
  type ChainBody,
  analyseCycle,
  envelopeStatus,
  evaluateExtremes,
  evaluateLimit,
  pinStresses,
  pinWear,
  worstStatus,
} from '@/features/loads/engine';

// Values below are chosen to be exact in binary floating point, so boundaries are tested exactly.
describe('envelope statuses (upper limits)', () => {
  it('defaults the near margin to 0.9', () => expect(DEFAULT_NEAR_MARGIN).toBe(0.9));

  it.each([
    [0, 'within'],
    [8.75, 'within'],
    [9, 'near'], // 9/10 = 0.9 exactly: the margin itself counts as near
    [10, 'near'], // at the limit: allowed, so not over
    [10.0625, 'over'],
  ] as const)('%d against a limit of 10 → %s', (value, status) => {
    const e = evaluateLimit(value, { kind: 'upper', max: 10 });
    expect(e.ratio).toBe(value / 10);
    expect(e.status).toBe(status);
  });

  it('takes a configurable margin', () => {
    expect(evaluateLimit(7.5, { kind: 'upper', max: 10 }, 0.75).status).toBe('near');
    expect(evaluateLimit(7.25, { kind: 'upper', max: 10 }, 0.75).status).toBe('within');
  });

  it('treats an unreadable ratio as over, never as a pass', () => {
    expect(envelopeStatus(Number.NaN)).toBe('over');
  });

  it('names the statuses and orders them', () => {
    expect(ENVELOPE_STATUS_LABEL).toEqual({ within: 'Within', near: 'Near limit', over: 'Over limit' });
    expect(worstStatus(['within', 'near', 'within'])).toBe('near');
    expect(worstStatus(['near', 'over'])).toBe('over');
    expect(worstStatus([])).toBe('within');
  });
});

describe('lower limits: pin diameter against nominal and minimum (wear allowance used)', () => {
  // Invented pin: 50 mm new, 46 mm minimum — a 4 mm allowance (exact in binary as plain numbers).
  const limit = { kind: 'lower', min: 46, nominal: 50 } as const;
  it.each([
    [50.5, -0.125, 'within'], // oversize reading: no wear used
    [50, 0, 'within'],
    [47, 0.75, 'near'], // at a 0.75 margin
    [46.5, 0.875, 'within'],
    [46.25, 0.9375, 'near'],
    [46, 1, 'near'], // at the minimum: still allowed
    [45.75, 1.0625, 'over'],
  ] as const)('measured %d → ratio %d', (measured, ratio, status) => {
    const e = evaluateLimit(measured, limit, measured === 47 ? 0.75 : 0.9);
    expect(e.ratio).toBe(ratio);
    expect(e.status).toBe(status);
  });

  it('without a nominal, the ratio is min / value', () => {
    expect(evaluateLimit(50, { kind: 'lower', min: 40 }).ratio).toBe(0.8);
    expect(evaluateLimit(32, { kind: 'lower', min: 40 }).status).toBe('over');
  });
});

describe('two-sided limits: rider Gz from −1.5 g to +6 g (illustrative limits, not a standard’s)', () => {
  const limit = { kind: 'range', min: -1.5, max: 6 } as const;
  it.each([
    [1, 1 / 6, 'within'],
    [4.5, 0.75, 'within'],
    [5.5, 5.5 / 6, 'near'],
    [6, 1, 'near'],
    [6.5, 6.5 / 6, 'over'],
    [-0.75, 0.5, 'within'],
    [-1.5, 1, 'near'],
    [-1.75, 1.75 / 1.5, 'over'],
  ] as const)('Gz %d → %s', (value, ratio, status) => {
    const e = evaluateLimit(value, limit);
    expect(e.ratio).toBeCloseTo(ratio, 12);
    expect(e.status).toBe(status);
  });

  it('a history is judged by whichever extreme uses more of its side', () => {
    // 4.5 g uses 75 % of the positive side, −1.25 g uses 83 % of the negative side.
    const e = evaluateExtremes(-1.25, 4.5, limit);
    expect(e.value).toBe(-1.25);
    expect(e.status).toBe('within');
    expect(evaluateExtremes(-1.4, 4.5, limit).status).toBe('near');
  });

  it('a range not containing 0 measures from its middle; a one-sided one away from 0 is within or over', () => {
    expect(evaluateLimit(3, { kind: 'range', min: 2, max: 4 }).ratio).toBe(0);
    expect(evaluateLimit(4, { kind: 'range', min: 2, max: 4 }).ratio).toBe(1);
    expect(evaluateLimit(1.5, { kind: 'range', min: 2, max: 4 }).status).toBe('over');
    expect(evaluateLimit(0.3, { kind: 'range', min: 0.2 }).status).toBe('within');
    expect(evaluateLimit(0.1, { kind: 'range', min: 0.2 }).status).toBe('over');
  });
});

describe('pin checks (τ = 4F/(πd²) single, 2F/(πd²) double shear; p = F/(d·t); hand-calculated)', () => {
  // By hand: F = 100 kN on a 50 mm pin: A = π·0.05²/4 = 1.9635e-3 m².
  it('single shear: 50.93 MPa; double shear: 25.46 MPa; bearing over a 40 mm lug: 50.0 MPa', () => {
    const single = pinStresses(100_000, { diameterM: 0.05, shear: 'single', bearingLengthM: 0.04 });
    const double = pinStresses(100_000, { diameterM: 0.05, shear: 'double', bearingLengthM: 0.04 });
    expect(single.shearAreaM2).toBeCloseTo(1.9635e-3, 7);
    expect(single.shearStressPa / 1e6).toBeCloseTo(50.93, 2);
    expect(double.shearStressPa / 1e6).toBeCloseTo(25.46, 2);
    expect(single.bearingPressurePa / 1e6).toBeCloseTo(50.0, 9);
  });

  it('wear: 50.00 mm nominal, 49.80 mm minimum, 49.90 mm measured → half the allowance used', () => {
    const w = pinWear(0.05, 0.0498, 0.0499);
    expect(w.lossM).toBeCloseTo(0.0001, 12);
    expect(w.usedRatio).toBeCloseTo(0.5, 9);
    expect(w.remainingM).toBeCloseTo(0.0001, 12);
    expect(() => pinWear(0.05, 0.05, 0.049)).toThrow();
  });
});

describe('cycle envelope: every reading and result gets value, limit, ratio and status', () => {
  // The textbook driven rod (m = 100 kg, L = 2 m, ω = 3 rad/s): peak 1881 N, torque 981 N·m.
  const rod: ChainBody = { name: 'arm', massKg: 100, cgM: [1, 0], inertiaCgKgM2: 100 / 3 };
  const cycle = analyseCycle({
    bodies: [rod],
    gravityMS2: 9.81,
    profiles: [{ kind: 'constant', rpm: (3 * 60) / (2 * Math.PI) }],
    samples: 361,
    seats: [{ name: 'tip seat', body: 0, positionM: [2, 0], spineAngleRad: Math.PI }],
    limits: {
      joints: [
        {
          maxRateRadS: 4,
          maxForceN: 2000,
          maxTorqueNm: 900,
          pin: {
            shear: 'double',
            bearingLengthM: 0.02,
            nominalDiameterM: 0.03,
            minimumDiameterM: 0.029,
            measuredDiameterM: 0.0295,
            maxShearStressPa: 1.3e6,
            maxBearingPressurePa: 5e6,
            measuredClearanceM: 0.0004,
            maxClearanceM: 0.0005,
          },
        },
      ],
      rider: { gz: { min: -1.5, max: 3 } },
    },
  });
  const byId = Object.fromEntries(cycle.envelope.map((e) => [e.id, e]));

  it('evaluates rate, force and torque of the joint', () => {
    expect(byId['joints.0.rate'].ratio).toBeCloseTo(3 / 4, 12);
    expect(byId['joints.0.rate'].status).toBe('within');
    expect(byId['joints.0.force'].value).toBeCloseTo(1881, 0);
    expect(byId['joints.0.force'].status).toBe('near');
    expect(byId['joints.0.torque'].value).toBeCloseTo(981, 0);
    expect(byId['joints.0.torque'].status).toBe('over');
    expect(byId['joints.0.torque'].quantity).toBe('moment');
  });

  it('checks the pin at the peak load, with the worn diameter', () => {
    const d = 0.0295;
    const shear = (2 * 1881) / (Math.PI * d * d);
    expect(byId['joints.0.pin.shear'].value).toBeCloseTo(shear, 3);
    expect(byId['joints.0.pin.shear'].status).toBe('over');
    expect(byId['joints.0.pin.bearing'].value).toBeCloseTo(1881 / (d * 0.02), 3);
    expect(byId['joints.0.pin.bearing'].status).toBe('within');
    expect(byId['joints.0.pin.diameter'].ratio).toBeCloseTo(0.5, 9);
    expect(byId['joints.0.pin.clearance'].ratio).toBeCloseTo(0.8, 12);
    expect(cycle.pins[0].wear?.usedRatio).toBeCloseTo(0.5, 9);
  });

  it('checks rider Gz per seat and rolls everything up into the worst status', () => {
    const gz = byId['seats.0.gz'];
    // Tip seat, head to the hub: Gz from (9·2 − 9.81)/g0 at the top to (9·2 + 9.81)/g0 at the bottom.
    // Envelope items are SI (m/s²), like every quantity the engine reports; seat histories stay in g.
    expect(gz.value).toBeCloseTo(18 + 9.81, 9);
    expect(cycle.seats[0].extremes.gz.max).toBeCloseTo((18 + 9.81) / 9.80665, 9);
    expect(gz.status).toBe('near');
    expect(cycle.status).toBe('over');
    expect(cycle.envelope.every((e) => e.limit && Number.isFinite(e.ratio) && e.label.length > 0)).toBe(true);
  });
});
