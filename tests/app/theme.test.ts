import { contrastPairs } from '@/components/theme';
import { contrast } from '@/tests/support/contrast';

test('the WCAG formula reproduces its known extremes (black on white is 21:1)', () => {
  expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 5);
  expect(contrast('#777777', '#FFFFFF')).toBeCloseTo(4.48, 2); // the well-known "#777 just fails AA" value
});

test.each(contrastPairs)('text %s on %s meets WCAG AA (4.5:1)', (fg, bg) => {
  expect(contrast(fg, bg)).toBeGreaterThanOrEqual(4.5);
});
