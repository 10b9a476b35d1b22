/**
 * Tap timer statistics against values worked by hand (shown beside each case). The outlier rule is the
 * median ± 3 · 1.4826 · MAD rule of Leys et al. (2013, J. Exp. Soc. Psychol. 49(4), 764–766; cited from
 * memory), with 1.4826 = 1/Φ⁻¹(0.75) and Φ⁻¹(0.75) = 0.6745 from a standard normal table.
 */
import { MAD_TO_SD, mad, median, sampleSd, tapResult, tapStats } from '@/features/tap-timer/stats';

/** Cumulative tap times (ms) from intervals (s). */
const taps = (intervals: number[]) =>
  intervals.reduce<number[]>((acc, s) => [...acc, acc[acc.length - 1] + Math.round(s * 1000)], [0]);

test('the MAD scale factor is 1/Φ⁻¹(0.75)', () => {
  expect(MAD_TO_SD).toBeCloseTo(1 / 0.6745, 3);
});

test('median, MAD and sample SD on small hand-worked sets', () => {
  expect(median([3, 1, 2])).toBe(2);
  expect(median([4, 1, 3, 2])).toBe(2.5);
  // |x − 2| = 1, 0, 1, 2 → median of {0, 1, 1, 2} = 1
  expect(mad([1, 2, 3, 4])).toBe(1);
  // mean 5; squares 9,1,1,1,0,0,4,16 → 32/7
  expect(sampleSd([2, 4, 4, 4, 5, 5, 7, 9])).toBeCloseTo(Math.sqrt(32 / 7), 12);
});

test('steady taps: every interval kept; period = mean, rpm = 60/period, spread = SD', () => {
  // Intervals 2.0, 2.1, 1.9, 2.1, 1.9 s: mean 2.0; deviations 0, ±0.1 → SD = √(0.04/4) = 0.1; rpm 30.
  const s = tapStats(taps([2.0, 2.1, 1.9, 2.1, 1.9]));
  expect(s).not.toBeNull();
  expect(s!.discarded).toBe(0);
  expect(s!.used).toBe(5);
  expect(s!.periodS).toBeCloseTo(2.0, 12);
  expect(s!.rpm).toBeCloseTo(30, 10);
  expect(s!.spreadS).toBeCloseTo(0.1, 12);
  expect(s!.rangeS).toBeCloseTo(0.2, 12);
  expect(s!.medianS).toBeCloseTo(2.0, 12);
});

test('a missed tap (an interval about twice the median) is set aside with its reason', () => {
  // 2, 2, 4, 2, 2 → median 2; 4/2 = 2 → missed tap. Kept 2, 2, 2, 2: period 2, SD 0.
  const s = tapStats(taps([2, 2, 4, 2, 2]))!;
  expect(s.intervals.map((i) => i.kept)).toEqual([true, true, false, true, true]);
  expect(s.intervals[2].reason).toMatch(/twice .* missed tap/);
  expect(s.periodS).toBe(2);
  expect(s.spreadS).toBe(0);
  expect(tapResult(s)).toEqual({ periodS: 2, rpm: 30, spreadS: 0, used: 4, discarded: 1 });
});

test('an extra tap: the short interval by the ratio, its short neighbour by the robust rule', () => {
  // 2, 2, 0.3, 1.7, 2 → median 2. 0.3/2 = 0.15 → extra tap. |dev| = 0, 0, 1.7, 0.3, 0 → MAD 0, so the
  // robust SD is the floor 2 % × 2 = 0.04 s and the limit 0.12 s; |1.7 − 2| = 0.3 > 0.12 → set aside.
  const s = tapStats(taps([2, 2, 0.3, 1.7, 2]))!;
  expect(s.intervals.map((i) => i.kept)).toEqual([true, true, false, false, true]);
  expect(s.intervals[2].reason).toMatch(/extra tap/);
  expect(s.intervals[3].reason).toMatch(/robust standard deviations/);
  expect(s.periodS).toBe(2);
});

test('the median ± 3·1.4826·MAD rule on a swing timed by hand', () => {
  // 6.0, 6.2, 5.9, 6.1, 6.0, 7.4 s → median (6.0 + 6.1)/2 = 6.05; |dev| sorted .05 .05 .05 .15 .15 1.35
  // → MAD 0.10, robust SD 0.14826, limit 0.44478. 7.4 (ratio 1.22, not a missed tap) is 1.35 away → out.
  // Kept 6.0 6.2 5.9 6.1 6.0: mean 30.2/5 = 6.04; squares .0016 .0256 .0196 .0036 .0016 = .052 → SD √.013.
  const s = tapStats(taps([6.0, 6.2, 5.9, 6.1, 6.0, 7.4]))!;
  expect(s.medianAllS).toBeCloseTo(6.05, 12);
  expect(s.intervals.map((i) => i.kept)).toEqual([true, true, true, true, true, false]);
  expect(s.intervals[5].reason).toContain('0.15 s');
  expect(s.periodS).toBeCloseTo(6.04, 12);
  expect(s.spreadS).toBeCloseTo(Math.sqrt(0.013), 12);
  expect(s.rpm).toBeCloseTo(60 / 6.04, 10);
  expect(s.used).toBe(5);
  expect(s.discarded).toBe(1);
});

test('below three intervals nothing is judged and no value is offered yet', () => {
  const s = tapStats(taps([2, 4]))!;
  expect(s.discarded).toBe(0);
  expect(s.periodS).toBe(3);
  expect(tapResult(s)).toBeNull();
  expect(tapStats([1000])).toBeNull();
  expect(tapStats([])).toBeNull();
});

test('taps out of order are an error, not a negative period', () => {
  expect(() => tapStats([0, 2000, 1500])).toThrow(/Tap 3 is not after tap 2/);
  expect(() => tapStats([0, 0])).toThrow();
});
