/**
 * Severity marks: every severity has its own shape and says its label from severityInfo, so colour is
 * never the only signal, and each label stays readable on its background.
 */
import { render, screen } from '@testing-library/react-native';

import { colors } from '@/components/theme';
import { findingSeverities, severityInfo } from '@/features/review/schema';
import { SeverityMark, severityLook } from '@/features/review/severity-mark';

/**
 * WCAG 2.1 contrast ratio (W3C Recommendation, definitions of "relative luminance" and "contrast
 * ratio"; success criterion 1.4.3 asks 4.5:1 for normal text).
 */
function luminance(hex: string): number {
  const n = parseInt(hex.slice(1), 16);
  const channel = (v: number) => {
    const c = v / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * channel((n >> 16) & 255) + 0.7152 * channel((n >> 8) & 255) + 0.0722 * channel(n & 255);
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

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
