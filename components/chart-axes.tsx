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
        <G key={`y${t}`}>
          <Line
            x1={M.left}
            x2={width - M.right}
            y1={y(t)}
            y2={y(t)}
            stroke={colors.surfaceSunk}
            strokeWidth={1}
          />
          <SvgText
            x={M.left - 6}
            y={y(t) + 4}
            fontSize={11}
            fontFamily={fonts.mono}
            fill={colors.textMuted}
            textAnchor="end"
          >
            {yFormat(t)}
          </SvgText>
        </G>
      ))}
      {xTicks.map((t) => (
        <G key={`x${t}`}>
          <Line
            x1={x(t)}
            x2={x(t)}
            y1={M.top}
            y2={height - M.bottom}
            stroke={colors.surfaceSunk}
            strokeWidth={1}
          />
          <SvgText
            x={x(t)}
            y={height - M.bottom + 16}
            fontSize={11}
            fontFamily={fonts.mono}
            fill={colors.textMuted}
            textAnchor="middle"
          >
            {xFormat(t)}
          </SvgText>
        </G>
      ))}
    </>
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
