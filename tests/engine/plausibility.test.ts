/**
 * The plausibility rule for motion readings. Outside references: a period T and a rotational speed n are
 * the same motion when n = 60 / T rpm (definition of frequency; any mechanics textbook), and rpm ↔ rad/s
 * conversions are made with mathjs through features/units (which defines rpm as 1/60 r/s), not by hand. The 0.5× and
 * 1.5× bounds are the product owner's rule (issue 11), checked at exactly those values and just past them.
 * The worked case of the issue: a tapped period of 2.42 s on a swing designed at 9.5 s.
 */
import {
  PLAUSIBLE_HIGH,
  PLAUSIBLE_LOW,
  checkAgainstDesign,
  checkReading,
  designValueSI,
  plausibilityText,
  unconfirmedImplausible,
} from '@/features/records/plausibility';
import type { DesignMotion } from '@/features/loads/design-schema';
import { toSI } from '@/lib/units';
import { skylarkDesign } from '@/server/seed/demo-design';

const rpmToRadS = (rpm: number) => toSI(rpm, 'rate', 'rpm');
const degToRad = (d: number) => toSI(d, 'angle', 'deg');

const wheel: DesignMotion = { joint: 0, kind: 'constant', rpm: 12 };
const reversed: DesignMotion = { joint: 0, kind: 'constant', rpm: -12 };
const pendulum: DesignMotion = { joint: 0, kind: 'swing', amplitudeRad: degToRad(110), periodS: 9.5 };
const held: DesignMotion = { joint: 0, kind: 'fixed', angleRad: 0 };

const speed = (rpm: number) => ({ kind: 'speed', joint: 0, valueSI: rpmToRadS(rpm) });
const period = (s: number) => ({ kind: 'period', joint: 0, valueSI: s });
const amplitude = (d: number) => ({ kind: 'amplitude', joint: 0, valueSI: degToRad(d) });

describe('constant motion: the design speed', () => {
  test('speed at exactly 0.5× and 1.5× the design rpm is plausible; just past either is not', () => {
    expect(PLAUSIBLE_LOW).toBe(0.5);
    expect(PLAUSIBLE_HIGH).toBe(1.5);
    // 12 rpm design: 6 and 18 rpm are the bounds (typed in rpm, stored in rad/s by mathjs).
    expect(checkReading(wheel, speed(6))).toMatchObject({ plausible: true });
    expect(checkReading(wheel, speed(18))).toMatchObject({ plausible: true });
    expect(checkReading(wheel, speed(12))!.ratio).toBeCloseTo(1, 12);
    expect(checkReading(wheel, speed(5.99))).toMatchObject({ plausible: false });
    expect(checkReading(wheel, speed(18.01))).toMatchObject({ plausible: false });
  });

  test('the design speed is compared in rad/s, whatever the direction of turning', () => {
    expect(designValueSI(wheel, 'speed')).toBeCloseTo(rpmToRadS(12), 12);
    expect(designValueSI(reversed, 'speed')).toBeCloseTo(rpmToRadS(12), 12);
    expect(checkReading(reversed, speed(12))).toMatchObject({ plausible: true });
  });

  test('a period is one revolution: it compares as the rate 60 / T, at the same bounds', () => {
    // Design 12 rpm ↔ 5 s per revolution. 0.5× the rate = 10 s; 1.5× the rate = 3.333… s.
    expect(designValueSI(wheel, 'period')).toBeCloseTo(5, 12);
    expect(checkReading(wheel, period(10))).toMatchObject({ plausible: true, ratio: 0.5 });
    expect(checkReading(wheel, period(10 / 3))).toMatchObject({ plausible: true });
    expect(checkReading(wheel, period(10.01))).toMatchObject({ plausible: false });
    expect(checkReading(wheel, period(3.3))).toMatchObject({ plausible: false });
  });

  test('period ↔ rate equivalence: a speed and the period of the same motion get the same ratio', () => {
    for (const rpm of [3, 5.99, 6, 9, 12, 17.5, 18, 18.01, 40]) {
      const bySpeed = checkReading(wheel, speed(rpm))!;
      const byPeriod = checkReading(wheel, period(60 / rpm))!;
      expect(byPeriod.ratio).toBeCloseTo(bySpeed.ratio, 10);
      expect(byPeriod.plausible).toBe(bySpeed.plausible);
    }
  });

  test('an amplitude reading on a turning joint is not used by the load check, so it is not checked', () => {
    expect(checkReading(wheel, amplitude(40))).toBeNull();
  });
});

describe('swing motion: the design period and amplitude', () => {
  test("the issue's case: 2.42 s tapped against a 9.5 s design swing is 3.93× the design rate", () => {
    const c = checkReading(pendulum, period(2.42))!;
    expect(c.plausible).toBe(false);
    expect(c.designSI).toBe(9.5);
    // 9.5 / 2.42 = 3.9256…
    expect(c.ratio).toBeCloseTo(9.5 / 2.42, 12);
    expect(plausibilityText(c)).toBe('3.93 × the design rate (design period 9.50 s)');
  });

  test('one pass timed instead of there and back halves the period: twice the design rate, so out', () => {
    // Half the design period = twice the design rate: outside 1.5×.
    expect(checkReading(pendulum, period(4.75))).toMatchObject({ plausible: false, ratio: 2 });
    // Periods at the bounds: 9.5 / 1.5 = 6.333… s and 9.5 / 0.5 = 19 s.
    expect(checkReading(pendulum, period(9.5 / 1.5))).toMatchObject({ plausible: true });
    expect(checkReading(pendulum, period(19))).toMatchObject({ plausible: true });
    expect(checkReading(pendulum, period(6.3))).toMatchObject({ plausible: false });
    expect(checkReading(pendulum, period(19.05))).toMatchObject({ plausible: false });
  });

  test('amplitude compares directly with the design amplitude (each side of centre), bounds included', () => {
    // 110° design: 55° and 165° are the bounds (typed in degrees, stored in radians).
    expect(checkReading(pendulum, amplitude(55))).toMatchObject({ plausible: true });
    expect(checkReading(pendulum, amplitude(165))).toMatchObject({ plausible: true });
    expect(checkReading(pendulum, amplitude(54.9))).toMatchObject({ plausible: false });
    expect(checkReading(pendulum, amplitude(165.1))).toMatchObject({ plausible: false });
    expect(plausibilityText(checkReading(pendulum, amplitude(30))!)).toBe(
      '0.27 × the design amplitude (design amplitude 110.0°)',
    );
  });

  test('a speed reading on a swinging joint is not used by the load check, so it is not checked', () => {
    expect(checkReading(pendulum, speed(6))).toBeNull();
  });
});

describe('held joints and other readings', () => {
  test('a held (fixed) joint has no design rate: motion readings there are not checked', () => {
    expect(checkReading(held, speed(5))).toBeNull();
    expect(checkReading(held, period(3))).toBeNull();
    expect(checkReading(held, amplitude(10))).toBeNull();
  });

  test('wear readings and joints without design motion are not checked', () => {
    expect(checkReading(wheel, { kind: 'pin_diameter', joint: 0, valueSI: 0.1 })).toBeNull();
    expect(checkReading(undefined, speed(12))).toBeNull();
    // A design speed of 0 has no rate to compare with.
    expect(checkReading({ joint: 0, kind: 'constant', rpm: 0 }, speed(3))).toBeNull();
  });
});

describe('against whole design data', () => {
  const design = skylarkDesign;

  test('each reading is checked against the motion of its own joint', () => {
    // Joint 0 swings (9.5 s, 110°); joint 1 is held.
    expect(checkAgainstDesign(design, period(9.4))).toMatchObject({ plausible: true });
    expect(checkAgainstDesign(design, { ...period(2.42), joint: 1 })).toBeNull();
  });

  test('unconfirmed implausible readings are listed with their index; confirmed ones are not', () => {
    const confirmed = {
      ...period(2.42),
      plausibility: { designSI: 9.5, ratio: 3.93, confirmedAt: '2026-12-03T08:00:00Z' },
    };
    const list = unconfirmedImplausible(design, [period(9.4), period(2.42), confirmed, amplitude(20)]);
    expect(list.map((x) => x.index)).toEqual([1, 3]);
    expect(list[1].check.kind).toBe('amplitude');
  });
});
