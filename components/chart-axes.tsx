import { G, Line, Text as SvgText } from 'react-native-svg';

import { type PlacedTick, TICK_FONT_SIZE } from '@/components/chart-ticks';
import { colors, fonts } from '@/components/theme';

/** The plot's edges in px within the drawing. */
export type PlotBox = { left: number; right: number; top: number; bottom: number };

/**
 * Grid lines with their values, placed by `fitTicks` (components/chart-ticks.ts) so no two labels touch:
 * across the plot at each y tick, up the plot at each x tick.
 */
export function ChartTicks({ x, y, plot }: { x: PlacedTick[]; y: PlacedTick[]; plot: PlotBox }) {
  return (
    <>
      {y.map((t) => (
        <G key={`y${t.value}`}>
          <Line
            x1={plot.left}
            x2={plot.right}
            y1={t.at}
            y2={t.at}
            stroke={colors.surfaceSunk}
            strokeWidth={1}
          />
          <TickText x={plot.left - 6} y={t.labelAt + 4} anchor="end" text={t.text} />
        </G>
      ))}
      {x.map((t) => (
        <G key={`x${t.value}`}>
          <Line
            x1={t.at}
            x2={t.at}
            y1={plot.top}
            y2={plot.bottom}
            stroke={colors.surfaceSunk}
            strokeWidth={1}
          />
          <TickText x={t.labelAt} y={plot.bottom + 16} anchor="middle" text={t.text} />
        </G>
      ))}
    </>
  );
}

function TickText({ x, y, anchor, text }: { x: number; y: number; anchor: 'end' | 'middle'; text: string }) {
  return (
    <SvgText
      x={x}
      y={y}
      fontSize={TICK_FONT_SIZE}
      fontFamily={fonts.mono}
      fill={colors.textMuted}
      textAnchor={anchor}
    >
      {text}
    </SvgText>
  );
}

/** The axis titles: the x title under the plot, the y title turned up the drawing's left edge. */
export function AxisTitles({
  xLabel,
  yLabel,
  plot,
  height,
}: {
  xLabel: string;
  yLabel: string;
  plot: PlotBox;
  height: number;
}) {
  const midY = (plot.top + plot.bottom) / 2;
  return (
    <>
      <SvgText
        x={(plot.left + plot.right) / 2}
        y={height - 6}
        fontSize={12}
        fontFamily={fonts.semibold}
        fill={colors.textMuted}
        textAnchor="middle"
      >
        {xLabel}
      </SvgText>
      <SvgText
        x={Y_TITLE_X}
        y={midY}
        fontSize={12}
        fontFamily={fonts.semibold}
        fill={colors.textMuted}
        textAnchor="middle"
        transform={`rotate(-90 ${Y_TITLE_X} ${midY})`}
      >
        {yLabel}
      </SvgText>
    </>
  );
}

/** Where the turned y title's centre line is; its letters reach about 7 px either side. */
const Y_TITLE_X = 14;
/** The y tick labels keep clear of the turned title: they end this far in, plus their width. */
export const Y_TITLE_ROOM = Y_TITLE_X + 10;

/**
 * A limit across the plot at pixel height `y`: dashed, with its label at the right end (its baseline at
 * `labelY`, placed by `spreadLabels` so two limits' labels never collide), so a limit never rests on
 * colour alone.
 */
export function LimitLine({
  label,
  y,
  labelY,
  plot,
  color = colors.over,
}: {
  label: string;
  y: number;
  labelY: number;
  plot: PlotBox;
  color?: string;
}) {
  return (
    <G>
      <Line
        x1={plot.left}
        x2={plot.right}
        y1={y}
        y2={y}
        stroke={color}
        strokeWidth={1.5}
        strokeDasharray="8 5"
      />
      <SvgText
        x={plot.right - 4}
        y={labelY}
        fontSize={LIMIT_FONT_SIZE}
        fontFamily={fonts.semibold}
        fill={color}
        textAnchor="end"
      >
        {label}
      </SvgText>
    </G>
  );
}

export const LIMIT_FONT_SIZE = 11;
