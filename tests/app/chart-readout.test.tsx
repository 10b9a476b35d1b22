/**
 * The one chart (components/line-chart.tsx) read by pointing: a tap or drag on a phone (react-native's
 * responder events), and the arrow keys, show a cursor and a read-out of the x value and each series'
 * value at the nearest sample, in the units the axis titles name, and say the same in a polite live
 * region. The expected values are worked out here from the data (y = x²/100), not read back from the
 * chart; the pixel a value sits at comes from the plot's drawn rectangle and a linear map, as d3-scale's
 * `scaleLinear` defines it.
 */
import { act, fireEvent, render, screen } from '@testing-library/react-native';
import { Rect } from 'react-native-svg';

import { LineChart } from '@/components/line-chart';

const angles = Array.from({ length: 37 }, (_, i) => i * 10); // 0°, 10°, … 360°
const force = angles.map((a) => (a * a) / 100); // kN
// A second series sampled every 45° only: its nearest sample is found on its own x.
const sparse = Array.from({ length: 9 }, (_, i) => i * 45);

function drawChart(width: number) {
  render(
    <LineChart
      summary="Force on pivot 1 over the cycle"
      series={[
        { label: 'Force magnitude', x: angles, y: force, color: '#102A38' },
        { label: 'Coarse force', x: sparse, y: sparse.map((a) => a / 10), color: '#B34A16' },
      ]}
      xLabel="Main arm angle (°)"
      yLabel="Force (kN)"
      xDomain={[0, 360]}
    />,
  );
  const chart = screen.getByLabelText(/^Force on pivot 1 over the cycle/);
  act(() => {
    fireEvent(chart, 'layout', { nativeEvent: { layout: { width, height: 220, x: 0, y: 0 } } });
  });
  // The plot's own rectangle is the first drawn; x maps linearly from its left to its right edge.
  const plot = screen.UNSAFE_getAllByType(Rect)[0].props as { x: number; width: number };
  const px = (angle: number) => plot.x + (angle / 360) * plot.width;
  return { chart, px };
}

test('a tap shows the x value and each series’ value at the nearest sample, with units', () => {
  const { chart, px } = drawChart(400);
  expect(screen.queryByTestId('chart-readout')).toBeNull();
  // A finger at 123°: the nearest samples are 120° (every 10°) and 135° (every 45°).
  fireEvent(chart, 'responderGrant', { nativeEvent: { locationX: px(123) } });
  expect(screen.getByText('Main arm angle 120°')).toBeTruthy();
  expect(screen.getByText('Force magnitude 144 kN')).toBeTruthy(); // 120² / 100
  expect(screen.getByText('Coarse force 13.5 kN')).toBeTruthy(); // 135 / 10
  expect(screen.getByRole('status')).toHaveTextContent(
    'Main arm angle 120°: Force magnitude 144 kN, Coarse force 13.5 kN',
  );
  // Dragging to 287°: 290° and 270°.
  fireEvent(chart, 'responderMove', { nativeEvent: { locationX: px(287) } });
  expect(screen.getByText('Main arm angle 290°')).toBeTruthy();
  expect(screen.getByText('Force magnitude 841 kN')).toBeTruthy(); // 290² / 100
  expect(screen.getByText('Coarse force 27 kN')).toBeTruthy();
  // Past the plot's ends: the first and last samples.
  fireEvent(chart, 'responderMove', { nativeEvent: { locationX: 0 } });
  expect(screen.getByText('Main arm angle 0°')).toBeTruthy();
  fireEvent(chart, 'responderMove', { nativeEvent: { locationX: 400 } });
  expect(screen.getByText('Force magnitude 1296 kN')).toBeTruthy(); // 360² / 100
});

test('the arrow keys step through the samples one at a time; Escape hides the read-out', () => {
  const { chart } = drawChart(320);
  const key = (k: string) => fireEvent(chart, 'keyDown', { key: k, preventDefault: () => {} });
  key('ArrowRight');
  expect(screen.getByText('Main arm angle 0°')).toBeTruthy();
  key('ArrowRight');
  key('ArrowRight');
  expect(screen.getByText('Main arm angle 20°')).toBeTruthy();
  expect(screen.getByText('Force magnitude 4 kN')).toBeTruthy();
  key('ArrowLeft');
  expect(screen.getByText('Force magnitude 1 kN')).toBeTruthy();
  key('End');
  expect(screen.getByText('Main arm angle 360°')).toBeTruthy();
  key('ArrowRight');
  expect(screen.getByText('Main arm angle 360°')).toBeTruthy();
  key('Escape');
  expect(screen.queryByTestId('chart-readout')).toBeNull();
  expect(screen.getByRole('status')).toHaveTextContent('');
});
