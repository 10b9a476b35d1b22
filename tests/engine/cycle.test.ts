import {
  type ChainBody,
  DEFAULT_CYCLE_SAMPLES,
  analyseCycle,
  cycleResultToJson,
  localPolynomialFit,
} from '@/features/loads/engine';

const g = 9.81;
const rod = (m: number, L: number): ChainBody => ({
  name: 'arm',
  massKg: m,
  cgM: [L / 2, 0],
  inertiaCgKgM2: (m * L * L) / 12,
});

describe('constant rotation: the textbook driven rod over one revolution (m = 100 kg, L = 2 m, ω = 3 rad/s)', () => {
  const rpm = (3 * 60) / (2 * Math.PI);
  const cycle = analyseCycle({
    bodies: [rod(100, 2)],
    gravityMS2: g,
    profiles: [{ kind: 'constant', rpm }],
    samples: 361,
  });
  const joint = cycle.joints[0];

  it('samples one revolution by default, at 1° steps with 361 samples', () => {
    expect(cycle.durationS).toBeCloseTo((2 * Math.PI) / 3, 12);
    expect(cycle.timeS).toHaveLength(361);
    expect(joint.angleRad[360]).toBeCloseTo(2 * Math.PI, 12);
  });

  it('finds the peak pin force, 1881 N, at the bottom (270°) — textbook mg + mω²L/2', () => {
    expect(joint.peakForce.value).toBeCloseTo(100 * g + 100 * 9 * 1, 9);
    expect(joint.peakForce.index).toBe(270);
    expect(joint.peakForce.angleRad).toBeCloseTo((3 * Math.PI) / 2, 12);
    expect(joint.peakForce.timeS).toBeCloseTo(cycle.durationS * 0.75, 12);
    expect(joint.peakForce.forceN[1]).toBeCloseTo(1881, 0);
    // At the bottom the arm points down, so the pin's pull is along −x of the arm.
    expect(joint.peakForce.forceBodyN[0]).toBeCloseTo(-1881, 0);
  });

  it('reports the magnitude’s range 1881 − 81 = 1800 N (textbook 2·mω²L/2), while along the arm it is 2·m·g', () => {
    expect(joint.extremes.magnitudeN.max).toBeCloseTo(1881, 0);
    expect(joint.extremes.magnitudeN.min).toBeCloseTo(81, 0);
    expect(joint.extremes.magnitudeN.range).toBeCloseTo(2 * 100 * 9, 6);
    // Along the arm the force is constant: pure centripetal plus the weight's along-arm share.
    expect(joint.extremes.alongN.range).toBeCloseTo(2 * 100 * g, 6);
  });

  it('finds the drive-torque peak mg·L/2 = 981 N·m with the arm horizontal (textbook)', () => {
    expect(Math.abs(joint.peakTorque.value)).toBeCloseTo(100 * g * 1, 9);
    expect(Math.abs(Math.cos(joint.peakTorque.angleRad))).toBeCloseTo(1, 12);
    expect(joint.extremes.torqueNm.range).toBeCloseTo(2 * 100 * g, 9);
    expect(joint.peakRateRadS).toBeCloseTo(3, 12);
    // A joint that turns full circles has no swing amplitude.
    expect(joint.amplitudeRad).toBeNull();
  });

  it('uses at least 360 samples when none are asked for', () => {
    const d = analyseCycle({ bodies: [rod(100, 2)], profiles: [{ kind: 'constant', rpm }] });
    expect(DEFAULT_CYCLE_SAMPLES).toBeGreaterThanOrEqual(360);
    expect(d.samples).toBe(DEFAULT_CYCLE_SAMPLES);
  });
});

describe('spin-up ramp (standard result τ = I_O·α for a balanced rotor)', () => {
  // Invented balanced wheel: cg on the pivot, so gravity adds no torque; I = 5000 kg·m².
  const wheel: ChainBody = { name: 'wheel', massKg: 2000, cgM: [0, 0], inertiaCgKgM2: 5000 };
  const toRpm = 6;
  const rampTimeS = 10;
  const alpha = (toRpm * 2 * Math.PI) / 60 / rampTimeS;

  it('linear ramp: constant torque I·α while ramping, none while holding; angle and rate integrate', () => {
    const c = analyseCycle({
      bodies: [wheel],
      profiles: [{ kind: 'ramp', toRpm, rampTimeS, holdBeforeS: 2, holdAfterS: 4 }],
      samples: 1601,
    });
    expect(c.durationS).toBe(16);
    const j = c.joints[0];
    expect(Math.abs(j.peakTorque.value)).toBeCloseTo(5000 * alpha, 9);
    expect(j.peakTorque.timeS).toBeGreaterThan(2);
    expect(j.peakTorque.timeS).toBeLessThan(12);
    expect(j.torqueNm[0]).toBeCloseTo(0, 9);
    expect(j.torqueNm[1600]).toBeCloseTo(0, 9);
    expect(j.rateRadS[1600]).toBeCloseTo((toRpm * 2 * Math.PI) / 60, 12);
    // Angle at the end: ½·ω·t_ramp + ω·t_hold.
    expect(j.angleRad[1600]).toBeCloseTo(0.5 * alpha * rampTimeS * rampTimeS + alpha * rampTimeS * 4, 9);
    // The pin carries only the weight: the centre does not move.
    expect(j.extremes.magnitudeN.range).toBeCloseTo(0, 6);
    expect(j.peakForce.value).toBeCloseTo(2000 * 9.80665, 6);
  });

  it('smooth ramp: same end speed and angle travelled, peak torque π/2 times the linear ramp’s', () => {
    const c = analyseCycle({
      bodies: [wheel],
      profiles: [{ kind: 'ramp', toRpm, rampTimeS, shape: 'smooth' }],
      samples: 1001,
    });
    const j = c.joints[0];
    expect(j.rateRadS[1000]).toBeCloseTo((toRpm * 2 * Math.PI) / 60, 12);
    expect(j.angleRad[1000]).toBeCloseTo(0.5 * alpha * rampTimeS * rampTimeS, 9);
    expect(Math.abs(j.peakTorque.value)).toBeCloseTo((5000 * alpha * Math.PI) / 2, 6);
    expect(j.peakTorque.timeS).toBeCloseTo(rampTimeS / 2, 9);
  });
});

describe('harmonic swing of a hanging rod', () => {
  const A = 0.5;
  const T = 4;
  const c = analyseCycle({
    bodies: [rod(60, 3)],
    gravityMS2: g,
    profiles: [{ kind: 'swing', amplitudeRad: A, periodS: T, centreRad: -Math.PI / 2 }],
    samples: 401,
  });
  const j = c.joints[0];

  it('peaks at the bottom with m·(g + ω_max²·L/2), ω_max = A·2π/T (textbook fixed-axis rotation)', () => {
    const wMax = (A * 2 * Math.PI) / T;
    expect(j.peakForce.value).toBeCloseTo(60 * (g + wMax * wMax * 1.5), 9);
    expect(j.peakForce.angleRad).toBeCloseTo(-Math.PI / 2, 12);
    expect([0, 200, 400]).toContain(j.peakForce.index);
  });

  it('reports the amplitude and the peak rate', () => {
    expect(j.amplitudeRad).toBeCloseTo(A, 9);
    expect(j.peakRateRadS).toBeCloseTo((A * 2 * Math.PI) / T, 9);
    expect(c.durationS).toBe(T);
  });
});

describe('measured motion: Savitzky–Golay smoothing and differentiation', () => {
  it('reproduces the classic 5-point coefficients on even samples (Savitzky & Golay 1964 tables, from memory)', () => {
    // Smoothing (quadratic/cubic): (−3, 12, 17, 12, −3)/35; first derivative (cubic): (1, −8, 0, 8, −1)/12;
    // second derivative (quadratic/cubic): (2, −1, −2, −1, 2)/7.
    const times = [0, 1, 2, 3, 4];
    const smooth: number[] = [];
    const first: number[] = [];
    const second: number[] = [];
    for (let k = 0; k < 5; k++) {
      const impulse = times.map((_, j) => (j === k ? 1 : 0));
      const fit = localPolynomialFit(times, impulse, 2, 5, 3);
      smooth.push(fit.value);
      first.push(fit.first);
      second.push(fit.second);
    }
    [-3, 12, 17, 12, -3].forEach((c, k) => expect(smooth[k]).toBeCloseTo(c / 35, 12));
    [1, -8, 0, 8, -1].forEach((c, k) => expect(first[k]).toBeCloseTo(c / 12, 12));
    [2, -1, -2, -1, 2].forEach((c, k) => expect(second[k]).toBeCloseTo(c / 7, 12));
  });

  it('recovers rate and acceleration of a known swing from unevenly timed, noisy angle readings', () => {
    // Invented reading: 3 s period, ±0.8 rad, read every ~50 ms with jitter and ±2 mrad of noise.
    const w = (2 * Math.PI) / 3;
    const times: number[] = [];
    const angles: number[] = [];
    let t = 0.37;
    for (let k = 0; t < 7; k++) {
      times.push(t);
      angles.push(0.8 * Math.sin(w * t) + 0.002 * Math.sin(12.9898 * k * k));
      t += 0.05 + 0.01 * Math.sin(7.1 * k);
    }
    const c = analyseCycle({
      bodies: [rod(50, 2)],
      profiles: [{ kind: 'measured', timeS: times, angleRad: angles, windowPoints: 15 }],
      samples: 500,
    });
    const j = c.joints[0];
    let worstRate = 0;
    let worstAccel = 0;
    // The cycle's t = 0 is the first reading, so the true motion is shifted by times[0].
    for (let k = 20; k < 480; k++) {
      const tt = c.timeS[k] + times[0];
      worstRate = Math.max(worstRate, Math.abs(j.rateRadS[k] - 0.8 * w * Math.cos(w * tt)));
      worstAccel = Math.max(worstAccel, Math.abs(j.accelRadS2[k] + 0.8 * w * w * Math.sin(w * tt)));
    }
    // Peak true rate 1.68 rad/s, accel 3.5 rad/s²: within 2 % and 10 % of those.
    expect(worstRate).toBeLessThan(0.02 * 0.8 * w);
    expect(worstAccel).toBeLessThan(0.1 * 0.8 * w * w);
    expect(c.durationS).toBeCloseTo(times[times.length - 1] - times[0], 12);
  });

  it('integrates a measured rate record into the angle (a tachometer log of a spin-up)', () => {
    // Invented log: rate rising linearly 0 → 1.2 rad/s over 8 s, read every 0.25 s.
    const times = Array.from({ length: 33 }, (_, k) => k * 0.25);
    const rates = times.map((t) => 0.15 * t);
    const c = analyseCycle({
      bodies: [rod(50, 2)],
      profiles: [{ kind: 'measured', timeS: times, rateRadS: rates, startAngleRad: 0.1 }],
      samples: 161,
    });
    const j = c.joints[0];
    expect(j.accelRadS2[80]).toBeCloseTo(0.15, 9);
    expect(j.rateRadS[160]).toBeCloseTo(1.2, 9);
    expect(j.angleRad[160]).toBeCloseTo(0.1 + 0.5 * 0.15 * 64, 9);
  });
});

describe('rider accelerations in seat axes (specific force (a − g)/g0; domain notes’ rider convention)', () => {
  const g0 = 9.80665;

  it('a rider sitting still feels +1 Gz and no Gx (standard: 1 g at rest)', () => {
    const c = analyseCycle({
      bodies: [rod(100, 4)],
      profiles: [{ kind: 'fixed', angleRad: 0 }],
      durationS: 1,
      samples: 3,
      seats: [{ name: 'upright', body: 0, positionM: [3, 0], spineAngleRad: Math.PI / 2 }],
    });
    expect(c.seats[0].gz[1]).toBeCloseTo(1, 12);
    expect(c.seats[0].gx[1]).toBeCloseTo(0, 12);
  });

  it('pushed forward, the rider reads +Gx (eyes back) facing the push, −Gx facing away', () => {
    // Arm at rest at angle 0 starting to swing with α = A·(2π/T)²; seat 2 m below the pivot.
    const A = 0.3;
    const T = 2;
    const alpha = A * ((2 * Math.PI) / T) ** 2;
    const c = analyseCycle({
      bodies: [rod(100, 4)],
      profiles: [{ kind: 'swing', amplitudeRad: A, periodS: T, centreRad: A, phaseRad: -Math.PI / 2 }],
      samples: 101,
      seats: [
        { name: 'facing +x', body: 0, positionM: [0, -2], spineAngleRad: Math.PI / 2 },
        { name: 'facing −x', body: 0, positionM: [0, -2], spineAngleRad: Math.PI / 2, facing: 'ccw' },
      ],
    });
    // At t = 0: angle 0, rate 0, α > 0 ⇒ the seat accelerates along +x at α·2 m.
    expect(c.joints[0].angleRad[0]).toBeCloseTo(0, 12);
    expect(c.seats[0].gx[0]).toBeCloseTo((alpha * 2) / g0, 12);
    expect(c.seats[1].gx[0]).toBeCloseTo((-alpha * 2) / g0, 12);
    expect(c.seats[0].gz[0]).toBeCloseTo(1, 12);
  });

  it('on a spinning arm in a horizontal plane, head to the hub: +Gz = ω²r/g0 (standard centripetal)', () => {
    const rpm = 12;
    const w = (rpm * 2 * Math.PI) / 60;
    const c = analyseCycle({
      bodies: [rod(800, 12)],
      gravityMS2: 0,
      profiles: [{ kind: 'constant', rpm }],
      seats: [{ name: 'tip', body: 0, positionM: [12, 0], spineAngleRad: Math.PI }],
    });
    const gz = c.seats[0].extremes.gz;
    expect(gz.min).toBeCloseTo((w * w * 12) / g0, 9);
    expect(gz.max).toBeCloseTo((w * w * 12) / g0, 9);
    expect(gz.max).toBeCloseTo(1.93, 2);
  });
});

describe('JSON form of a cycle result', () => {
  it('turns every typed array into a plain array with the same numbers', () => {
    const c = analyseCycle({ bodies: [rod(10, 1)], profiles: [{ kind: 'constant', rpm: 10 }], samples: 37 });
    const json = cycleResultToJson(c);
    const back = JSON.parse(JSON.stringify(json));
    expect(Array.isArray(back.timeS)).toBe(true);
    expect(back.joints[0].forceMagnitudeN).toEqual(Array.from(c.joints[0].forceMagnitudeN));
    expect(back.joints[0].peakForce.value).toBe(c.joints[0].peakForce.value);
  });
});
