import type { ScaleLinear } from 'd3-scale';
import { G, Line, Text as SvgText } from 'react-native-svg';

import { colors, fonts } from '@/components/theme';

/** Room round a chart's plot for tick labels and axis titles. */
type ChartMargin = { top: number; right: number; bottom: number; left: number };

type Scale = ScaleLinear<number, number>;

/** Grid lines with their values: across the plot at each y tick, up the plot at each x tick. */
export function ChartTicks({
  x,
  y,
  xTicks,
  yTicks,
  xFormat,
  yFormat,
  width,
  height,
  margin: M,
}: {
  x: Scale;
  y: Scale;
  xTicks: readonly number[];
  yTicks: readonly number[];
  xFormat: (v: number) => string;
  yFormat: (v: number) => string;
  width: number;
  height: number;
  margin: ChartMargin;
}) {
  return (
    <>
      {yTicks.map((t) => (
        <GridTick
          key={`y${t}`}
          line={[M.left, y(t), width - M.right, y(t)]}
          label={[M.left - 6, y(t) + 4, 'end']}
          text={yFormat(t)}
        />
      ))}
      {xTicks.map((t) => (
        <GridTick
          key={`x${t}`}
          line={[x(t), M.top, x(t), height - M.bottom]}
          label={[x(t), height - M.bottom + 16, 'middle']}
          text={xFormat(t)}
        />
      ))}
    </>
  );
}

/** One grid line, from (x1, y1) to (x2, y2), and its value written at (x, y). */
function GridTick({
  line: [x1, y1, x2, y2],
  label: [x, y, anchor],
  text,
}: {
  line: [number, number, number, number];
  label: [number, number, 'end' | 'middle'];
  text: string;
}) {
  return (
    <G>
      <Line x1={x1} x2={x2} y1={y1} y2={y2} stroke={colors.surfaceSunk} strokeWidth={1} />
      <SvgText x={x} y={y} fontSize={11} fontFamily={fonts.mono} fill={colors.textMuted} textAnchor={anchor}>
        {text}
      </SvgText>
    </G>
  );
}

/** The axis titles: the x title under the plot, the y title turned up its left side. */
export function AxisTitles({
  xLabel,
  yLabel,
  width,
  height,
  margin: M,
}: {
  xLabel: string;
  yLabel: string;
  width: number;
  height: number;
  margin: ChartMargin;
}) {
  const midY = (M.top + height - M.bottom) / 2;
  return (
    <>
      <SvgText
        x={(M.left + width - M.right) / 2}
        y={height - 6}
        fontSize={12}
        fontFamily={fonts.semibold}
        fill={colors.textMuted}
        textAnchor="middle"
      >
        {xLabel}
      </SvgText>
      <SvgText
        x={14}
        y={midY}
        fontSize={12}
        fontFamily={fonts.semibold}
        fill={colors.textMuted}
        textAnchor="middle"
        transform={`rotate(-90 14 ${midY})`}
      >
        {yLabel}
      </SvgText>
    </>
  );
}
