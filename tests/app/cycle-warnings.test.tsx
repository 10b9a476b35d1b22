/**
 * A load check's warnings are shown with its result (the calculator and the inspector's load check both
 * render CycleResults): those asking for attention under a "Check this" mark before the results, notes on
 * how the result was computed quieter, each naming the pivot or seat it concerns; an answer from before
 * results carried warnings still renders. The result itself is the engine's, on a rod turning steadily.
 */
import { render, screen } from '@testing-library/react-native';

import { CycleResults } from '@/features/loads/cycle-results';
import { type CycleResult, type CycleWarning, analyseCycle } from '@/features/loads/engine';
import { groupWarnings, sortWarnings, warningSubject } from '@/features/loads/format';
import { cycleWarningLevelVocabulary } from '@/lib/vocabulary';

function rodResult(warnings: CycleWarning[]): CycleResult {
  const r = analyseCycle({
    bodies: [{ name: 'Arm', massKg: 200, cgM: [2, 0], inertiaCgKgM2: 267 }],
    profiles: [{ kind: 'constant', rpm: 10 }],
    samples: 73,
  });
  return { ...r, warnings };
}

const warnings: CycleWarning[] = [
  {
    code: 'smoothing',
    level: 'info',
    joint: 0,
    message: 'Smoothed with a 2.5 Hz low-pass filter (automatic).',
  },
  { code: 'noise', level: 'warning', joint: 0, message: 'The record is noisy: about 0.4° of noise.' },
  { code: 'gap', level: 'warning', message: 'The record has a gap of 0.8 s at 12.1 s.' },
];

test('warnings come first under their mark and words, notes follow, each naming its pivot', () => {
  render(<CycleResults result={rodResult(warnings)} system="si" xAxis="angle" />);
  expect(screen.getByLabelText('Warnings about this result')).toBeTruthy();
  expect(screen.getByText(cycleWarningLevelVocabulary.warning.label)).toBeTruthy();
  expect(screen.getByText('Pivot 1 · Arm: The record is noisy: about 0.4° of noise.')).toBeTruthy();
  expect(screen.getByText('The record has a gap of 0.8 s at 12.1 s.')).toBeTruthy();
  expect(screen.getByLabelText('How this result was computed')).toBeTruthy();
  expect(screen.getByText('Pivot 1 · Arm: Smoothed with a 2.5 Hz low-pass filter (automatic).')).toBeTruthy();
  // The warnings stand before the pivot loads, so nobody reads the numbers without them.
  const json = JSON.stringify(screen.toJSON());
  expect(json.indexOf('The record is noisy')).toBeLessThan(json.search(/pivot loads/i));
  expect(screen.getByText(/SAFETY CAUTION/)).toBeTruthy();
});

test('a result with only notes shows no warning mark', () => {
  render(<CycleResults result={rodResult([warnings[0]])} system="si" xAxis="angle" />);
  expect(screen.queryByText(cycleWarningLevelVocabulary.warning.label)).toBeNull();
  expect(screen.getByText(/Smoothed with a 2.5 Hz/)).toBeTruthy();
});

test('an answer from before results carried warnings renders as one without any', () => {
  const old = rodResult([]) as Partial<CycleResult>;
  delete old.warnings;
  render(<CycleResults result={old as CycleResult} system="si" xAxis="angle" />);
  expect(screen.getByText(/pivot loads over the cycle/i)).toBeTruthy();
  expect(screen.queryByLabelText('Warnings about this result')).toBeNull();
  expect(screen.queryByLabelText('How this result was computed')).toBeNull();
});

test('warnings sort before notes; a warning names its pivot or seat', () => {
  expect(sortWarnings(warnings).map((w) => w.code)).toEqual(['noise', 'gap', 'smoothing']);
  expect(sortWarnings(undefined)).toEqual([]);
  expect(warningSubject({ joint: 1 }, ['Arm', 'Gondola'], [])).toBe('Pivot 2 · Gondola');
  expect(warningSubject({ seat: 0 }, [], ['Front row'])).toBe('Seat Front row');
  expect(warningSubject({}, ['Arm'], ['Front row'])).toBeNull();
  // Two different shapes, so the level never rests on colour alone.
  expect(cycleWarningLevelVocabulary.warning.mark.icon).not.toBe(cycleWarningLevelVocabulary.info.mark.icon);
});

test('near-copies of one kind about one pivot (one per stop run) read as one line and a count', () => {
  const runs: CycleWarning[] = [1, 2, 3].map((k) => ({
    code: 'free-cycle-short',
    level: 'warning',
    joint: 1,
    message: `Emergency stop: the cycle is shorter than the free swing (${k} s)`,
  }));
  expect(groupWarnings([...runs, warnings[0]]).map((g) => [g.warning.code, g.more])).toEqual([
    ['free-cycle-short', 2],
    ['smoothing', 0],
  ]);
  render(<CycleResults result={rodResult(runs)} system="si" xAxis="angle" />);
  expect(screen.getByText(/\(1 s\) \(and 2 more like it\)$/)).toBeTruthy();
});
