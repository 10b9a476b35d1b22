import { contrastPairs } from '@/components/theme';

/**
 * WCAG 2.1 contrast ratio (W3C Recommendation, "relative luminance" and "contrast ratio"
 * definitions, success criterion 1.4.3: 4.5:1 for normal text).
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

test('the WCAG formula reproduces its known extremes (black on white is 21:1)', () => {
  expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 5);
  expect(contrast('#777777', '#FFFFFF')).toBeCloseTo(4.48, 2); // the well-known "#777 just fails AA" value
});

test.each(contrastPairs)('text %s on %s meets WCAG AA (4.5:1)', (fg, bg) => {
  expect(contrast(fg, bg)).toBeGreaterThanOrEqual(4.5);
});
