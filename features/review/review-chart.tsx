import type { ScaleLinear } from 'd3-scale';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, G, Line, Path, Rect } from 'react-native-svg';

import { AxisTitles, ChartTicks } from '@/components/chart-axes';
import { type ChartD3, useChartD3 } from '@/components/chart-d3-loader';
import { ChartFrame, LimitLine } from '@/components/chart-frame';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';

/** A line; a null or NaN y leaves a gap (e.g. where an angle wraps from 360° back to 0°). */
export type ReviewSeries = {
  label: string;
  x: readonly number[];
  y: readonly (number | null)[];
  color: string;
  dashed?: boolean;
  /** Draw each point as a dot too (few points, as in trends). */
  dots?: boolean;
};

/** A dashed, labelled horizontal line: a limit never rests on colour alone. */
type ReviewLimit = { label: string; y: number; color?: string };

/** The allowed range between two limits, tinted, with each side drawn as a limit line. */
export type ReviewBand = { min?: { label: string; y: number }; max?: { label: string; y: number } };

type Props = {
  series: ReviewSeries[];
  limits?: ReviewLimit[];
  band?: ReviewBand;
  /**
   * A vertical line, and a ringed dot where a dotted series meets it: e.g. the inspection under review
   * among its ride's others. Its label belongs in the summary and the words beside the chart.
   */
  marker?: { x: number; label: string };
  xLabel: string;
  yLabel: string;
  height?: number;
  xDomain?: [number, number];
  xTicks?: number[];
  xFormat?: (v: number) => string;
  /** Include 0 on the y axis (loads); off for values that drift near a large one (pin diameters). */
  zeroBased?: boolean;
  /** Read instead of the drawing. */
  summary: string;
};

const M = { top: 14, right: 16, bottom: 40, left: 60 };

/**
 * The review desk's chart: d3 scales and paths drawn with react-native-svg, like components/line-chart
 * (d3 on the web loads with the first chart, components/chart-d3-loader.web.ts),
 * plus what the desk needs there: gaps in a line, a tinted limit band, dots and a marker.
 */
export function ReviewChart({
  series,
  limits = [],
  band,
  marker,
  xLabel,
  yLabel,
  height = 220,
  xDomain,
  xTicks,
  xFormat = compact,
  zeroBased = true,
  summary,
}: Props) {
  const [width, setWidth] = useState(0);
  const d3 = useChartD3();
  const frame = {
    onWidth: setWidth,
    height,
    margin: M,
    summary,
    legend: series.length > 1 ? <Legend series={series} /> : null,
  };
  // Until d3 is here the frame stays as before its first measure: its height, legend and summary.
  if (!d3)
    return (
      <ChartFrame {...frame} width={0}>
        {null}
      </ChartFrame>
    );
  const xs = series.flatMap((s) => s.x.filter(finite));
  const bandYs = [band?.min?.y, band?.max?.y].filter(finite);
  const ys = [...series.flatMap((s) => s.y.filter(finite)), ...limits.map((l) => l.y), ...bandYs];
  const xExtent = xDomain ?? spread(Math.min(...xs), Math.max(...xs));
  const [lo, hi] = spread(Math.min(...ys), Math.max(...ys));
  const pad = (hi - lo) * 0.08;
  const yDomain: [number, number] = zeroBased
    ? [Math.min(0, lo), Math.max(0, hi) + pad]
    : [lo - pad, hi + pad];
  const x = d3
    .scaleLinear()
    .domain(xExtent)
    .range([M.left, Math.max(M.left + 10, width - M.right)]);
  const y = d3
    .scaleLinear()
    .domain(yDomain)
    .nice()
    .range([height - M.bottom, M.top]);
  const plotRight = width - M.right;

  return (
    <ChartFrame {...frame} width={width}>
      {band ? (
        <Rect
          x={M.left}
          width={plotRight - M.left}
          y={y(band.max?.y ?? yDomain[1])}
          height={Math.max(0, y(band.min?.y ?? yDomain[0]) - y(band.max?.y ?? yDomain[1]))}
          fill={colors.withinSoft}
        />
      ) : null}
      <ChartTicks
        x={x}
        y={y}
        xTicks={xTicks ?? x.ticks(width < 420 ? 4 : 6)}
        yTicks={y.ticks(5)}
        xFormat={xFormat}
        yFormat={compact}
        width={width}
        height={height}
        margin={M}
      />
      {yDomain[0] < 0 ? <Line x1={M.left} x2={plotRight} y1={y(0)} y2={y(0)} stroke={colors.border} /> : null}
      {marker ? (
        <Line
          x1={x(marker.x)}
          x2={x(marker.x)}
          y1={M.top}
          y2={height - M.bottom}
          stroke={colors.accent}
          strokeWidth={1.5}
        />
      ) : null}
      {series.map((s) => (
        <SeriesLine key={s.label} series={s} x={x} y={y} marker={marker} line={d3.line} />
      ))}
      <LimitLines limits={limits} band={band} y={y} left={M.left} right={plotRight} />
      <AxisTitles xLabel={xLabel} yLabel={yLabel} width={width} height={height} margin={M} />
    </ChartFrame>
  );
}

const finite = (v: number | null | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

type Scale = ScaleLinear<number, number>;

/** One series: its line, with gaps where a value is missing, and its dots when asked for. */
function SeriesLine({
  series: s,
  x,
  y,
  marker,
  line,
}: {
  series: ReviewSeries;
  x: Scale;
  y: Scale;
  marker: Props['marker'];
  line: ChartD3['line'];
}) {
  const pts = s.x.map((xv, i) => [xv, s.y[i]] as const);
  const d =
    line<readonly [number, number | null]>()
      .defined((p) => finite(p[0]) && finite(p[1]))
      .x((p) => x(p[0]))
      .y((p) => y(p[1] ?? 0))(pts) ?? '';
  return (
    <G>
      <Path
        d={d}
        stroke={s.color}
        strokeWidth={2}
        fill="none"
        strokeDasharray={s.dashed ? '6 4' : undefined}
      />
      {s.dots
        ? pts
            .filter((p): p is readonly [number, number] => finite(p[0]) && finite(p[1]))
            .map(([px, py]) => {
              const current = marker !== undefined && px === marker.x;
              return (
                <Circle
                  key={`${px}`}
                  cx={x(px)}
                  cy={y(py)}
                  r={current ? 6 : 3.5}
                  fill={current ? colors.surface : s.color}
                  stroke={current ? colors.accent : s.color}
                  strokeWidth={current ? 3 : 1}
                />
              );
            })
        : null}
    </G>
  );
}

/** The limit lines, each dashed and labelled, with both sides of a band among them. */
function LimitLines({
  limits,
  band,
  y,
  left,
  right,
}: {
  limits: ReviewLimit[];
  band: ReviewBand | undefined;
  y: Scale;
  left: number;
  right: number;
}) {
  return (
    <>
      {[
        ...limits,
        ...(band?.max ? [{ ...band.max, color: colors.over }] : []),
        ...(band?.min ? [{ ...band.min, color: colors.over }] : []),
      ].map((l) => (
        <LimitLine
          key={l.label}
          label={l.label}
          y={y(l.y)}
          left={left}
          right={right}
          color={l.color}
          // Labels of a lower line sit under it, so two sides of a band never collide.
          labelBelow={Boolean(band?.min && l.y === band.min.y)}
        />
      ))}
    </>
  );
}

function Legend({ series }: { series: ReviewSeries[] }) {
  return (
    <View style={styles.legend}>
      {series.map((s) => (
        <View key={s.label} style={styles.legendItem}>
          <Svg width={18} height={6}>
            <Line
              x1={0}
              x2={18}
              y1={3}
              y2={3}
              stroke={s.color}
              strokeWidth={3}
              strokeDasharray={s.dashed ? '5 3' : undefined}
            />
          </Svg>
          <Text variant="small">{s.label}</Text>
        </View>
      ))}
    </View>
  );
}

/** A usable domain even for one value (a single inspection, a flat line). */
function spread(lo: number, hi: number): [number, number] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return [0, 1];
  if (hi > lo) return [lo, hi];
  const half = Math.abs(lo) * 0.05 || 0.5;
  return [lo - half, hi + half];
}

function compact(v: number): string {
  const a = Math.abs(v);
  if (a >= 1e6) return `${+(v / 1e6).toFixed(1)}M`;
  if (a >= 1e4) return `${+(v / 1e3).toFixed(0)}k`;
  return `${+v.toPrecision(4)}`;
}

const styles = StyleSheet.create({
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, paddingLeft: M.left },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
});
