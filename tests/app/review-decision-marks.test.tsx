/**
 * Severity marks: every severity has its own shape and says its label from severityInfo, so colour is
 * never the only signal, and each label stays readable on its background.
 */
import { render, screen } from '@testing-library/react-native';

import { colors } from '@/components/theme';
import { findingSeverities } from '@/features/review/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import { SeverityMark, severityLook } from '@/features/notices/severity-mark';
import { contrast } from '@/tests/support/contrast';

test('the contrast formula gives the W3C’s extremes (black on white 21:1, equal colours 1:1)', () => {
  expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 5);
  expect(contrast('#336699', '#336699')).toBeCloseTo(1, 10);
});

test('each severity has a shape of its own', () => {
  const shapes = findingSeverities.map((s) => severityLook[s].shape);
  expect(new Set(shapes).size).toBe(findingSeverities.length);
});

test.each(findingSeverities)('%s: the label reaches 4.5:1 on its background (WCAG 2.1 AA)', (s) => {
  expect(contrast(severityLook[s].fg, severityLook[s].bg)).toBeGreaterThanOrEqual(4.5);
});

test('"Saving…" on a finding row reaches 4.5:1 on the surface (WCAG 2.1 AA)', () => {
  expect(contrast(colors.focus, colors.surface)).toBeGreaterThanOrEqual(4.5);
});

test.each(findingSeverities)('%s: the mark says its label from severityInfo', (s) => {
  render(<SeverityMark severity={s} />);
  expect(screen.getByText(severityInfo[s].label)).toBeTruthy();
  expect(screen.getByLabelText(`Severity: ${severityInfo[s].label}`)).toBeTruthy();
});
