import type { ScaleLinear } from 'd3-scale';
import { useMemo, useState } from 'react';
import { type GestureResponderEvent, StyleSheet, View, type ViewStyle } from 'react-native';
import Svg, { Circle, G, Line, Path, Rect } from 'react-native-svg';

import {
  AxisTitles,
  ChartTicks,
  LIMIT_FONT_SIZE,
  LimitLine,
  type PlotBox,
  Y_TITLE_ROOM,
} from '@/components/chart-axes';
import { type ChartD3, useChartD3 } from '@/components/chart-d3-loader';
import { nearestRank, sampleOrder } from '@/components/chart-nearest';
import { READ_HINT, hoverProps } from '@/components/chart-pointer';
import { fitTicks, labelHeight, labelWidth, spreadLabels } from '@/components/chart-ticks';
import { Text } from '@/components/text';
import { colors, fonts, space } from '@/components/theme';

/** A line; a null or NaN y (or x) leaves a gap, e.g. where an angle wraps from 360° back to 0°. */
export type ChartSeries = {
  label: string;
  x: ArrayLike<number>;
  y: ArrayLike<number | null>;
  color: string;
  dashed?: boolean;
  /** Draw each point as a dot too (few points, as in trends). */
  dots?: boolean;
};

/** A dashed, labelled horizontal line: a limit never rests on colour alone. */
export type ChartLimit = { label: string; y: number; color?: string };

/** The allowed range between two limits, tinted, with each side drawn as a limit line. */
export type ChartBand = { min?: { label: string; y: number }; max?: { label: string; y: number } };

type Props = {
  series: ChartSeries[];
  limits?: ChartLimit[];
  band?: ChartBand;
  /**
   * A vertical line, and a ringed dot where a dotted series meets it: e.g. the inspection under review
   * among its ride's others. Its label belongs in the summary and the words beside the chart.
   */
  marker?: { x: number; label: string };
  /** Axis titles; a unit in brackets ("Force (kN)") is the read-out's unit unless `xValue`/`yValue` say. */
  xLabel: string;
  yLabel: string;
  height?: number;
  /** Fixed x domain (e.g. [0, 360] for angle), else the data's extent. */
  xDomain?: [number, number];
  /** Ticks to choose from (thinned to what fits), else d3's nice ticks for the width. */
  xTicks?: number[];
  /** x values are times (ms since 1970): ticks fall on days, months, … */
  xTime?: boolean;
  xFormat?: (v: number) => string;
  /** Include 0 on the y axis (loads); off for values that drift near a large one (pin diameters). */
  zeroBased?: boolean;
  /** Read instead of the drawing. */
  summary: string;
  /** The read-out's x and y values, with their units. */
  xValue?: (v: number) => string;
  yValue?: (v: number) => string;
};

const TOP = 14;
const RIGHT = 16;
const BOTTOM = 40;

/**
 * The app's one chart: lines over x with limits, a tinted band, dots and a marker, drawn with
 * react-native-svg from d3's scales and paths (d3 on the web loads with the first chart,
 * components/chart-d3-loader.web.ts). Tick counts follow the drawn width and labels are placed so none
 * overlaps another (components/chart-ticks.ts). Pointing at the plot (a mouse on the web, a tap or drag on
 * a phone) or the arrow keys once it has focus show a cursor and a read-out of each series' value at the
 * nearest sample (components/chart-nearest.ts), which is also announced politely.
 */
export function LineChart(props: Props) {
  const { series, height = 220, summary } = props;
  const [width, setWidth] = useState(0);
  const d3 = useChartD3();
  const drawn = useMemo(
    () => (d3 && width > 0 ? drawChart(d3, props, width, height) : null),
    // `props` keeps its identity while only this chart's own state changes (the cursor), so the drawing
    // is worked out again only when the caller gives new data or the width changes.
    [d3, props, width, height],
  );
  const orders = useMemo(() => series.map((s) => sampleOrder(s.x, s.y)), [series]);
  const primary = orders.findIndex((o) => o.length > 0);
  const [rank, setRank] = useState<number | null>(null);
  const shown = rank !== null && primary >= 0 && drawn ? Math.min(rank, orders[primary].length - 1) : null;
  const readout = shown !== null && drawn ? readAt(props, orders, primary, shown, drawn) : null;

  const pointAt = (px: number) => {
    if (!drawn || primary < 0) return;
    setRank(nearestRank(series[primary].x, orders[primary], drawn.x.invert(px)));
  };
  const step = (key: string) => {
    if (primary < 0) return false;
    const last = orders[primary].length - 1;
    const now = shown;
    const next =
      key === 'ArrowRight'
        ? now === null
          ? 0
          : Math.min(last, now + 1)
        : key === 'ArrowLeft'
          ? now === null
            ? last
            : Math.max(0, now - 1)
          : key === 'Home'
            ? 0
            : key === 'End'
              ? last
              : undefined;
    if (key === 'Escape') setRank(null);
    if (next === undefined) return key === 'Escape';
    setRank(next);
    return true;
  };
  // Keys where there are keys (react-native-web passes them on; elsewhere the prop is unused).
  const events = {
    onKeyDown: (e: KeyboardEvent) => {
      if (step(e.key)) e.preventDefault();
    },
    onBlur: () => setRank(null),
    ...hoverProps(pointAt, () => setRank(null)),
  };
  const touch = (e: GestureResponderEvent) => pointAt(e.nativeEvent.locationX);

  return (
    <View style={styles.wrap}>
      <View
        role="img"
        accessibilityLabel={`${summary}.${READ_HINT}`}
        focusable
        onLayout={(e) => setWidth(e.nativeEvent.layout.width)}
        style={[{ height }, styles.plot]}
        onStartShouldSetResponder={() => true}
        onResponderGrant={touch}
        onResponderMove={touch}
        onResponderTerminationRequest={() => true}
        {...(events as object)}
      >
        {/* Until d3 and the width are here the frame keeps its height, so nothing around it moves. */}
        {drawn ? (
          <View style={styles.noPointer}>
            {drawn.drawing}
            {readout ? <Cursor readout={readout} plot={drawn.plot} width={width} /> : null}
          </View>
        ) : null}
      </View>
      <Text accessibilityLiveRegion="polite" role="status" style={styles.offscreen}>
        {readout ? readout.sentence : ''}
      </Text>
      {series.length > 1 ? <Legend series={series} /> : null}
    </View>
  );
}

type Drawn = {
  plot: PlotBox;
  x: ScaleLinear<number, number>;
  y: ScaleLinear<number, number>;
  drawing: React.ReactElement;
};

/** Scales, ticks that fit, limit labels apart, and the drawing itself: everything but the cursor. */
function drawChart(d3: ChartD3, props: Props, width: number, height: number): Drawn {
  const { series, limits = [], band, marker, xDomain, zeroBased = true, xFormat = compact } = props;
  const bandYs = [band?.min?.y, band?.max?.y].filter(finite);
  const [x0, x1] = xDomain ?? spread(...extent(series.map((s) => s.x)));
  const [lo, hi] = spread(...extent([...series.map((s) => s.y), [...limits.map((l) => l.y), ...bandYs]]));
  const pad = (hi - lo) * 0.08;
  const yDomain: [number, number] = zeroBased
    ? [Math.min(0, lo), Math.max(0, hi) + pad]
    : [lo - pad, hi + pad];
  const bottom = height - BOTTOM;
  const y = d3.scaleLinear().domain(yDomain).nice().range([bottom, TOP]);
  const yTicks = fitTicks({
    candidates: (n) => y.ticks(n),
    position: y,
    format: compact,
    length: bottom - TOP,
    along: 'y',
    bounds: [TOP - 6, bottom + 6],
  });
  // The left margin holds the widest y label and the turned y title, no more.
  const left = Y_TITLE_ROOM + Math.max(16, ...yTicks.map((t) => labelWidth(t.text))) + 6;
  const plot: PlotBox = { left, right: Math.max(left + 10, width - RIGHT), top: TOP, bottom };
  const x = d3.scaleLinear().domain([x0, x1]).range([plot.left, plot.right]);
  const given = props.xTicks;
  const xTicks = fitTicks({
    candidates: given
      ? () => given
      : props.xTime
        ? (n) =>
            d3
              .scaleUtc()
              .domain([x0, x1])
              .ticks(n)
              .map((d) => d.getTime())
        : (n) => x.ticks(n),
    position: x,
    format: xFormat,
    length: plot.right - plot.left,
    along: 'x',
    bounds: [Y_TITLE_ROOM, width - 2],
  });
  const allLimits = [
    ...limits.map((l) => ({ ...l, below: false })),
    ...(band?.max ? [{ ...band.max, color: colors.over, below: false }] : []),
    // The lower side of a band has its label under its line.
    ...(band?.min ? [{ ...band.min, color: colors.over, below: true }] : []),
  ];
  const limitHeight = labelHeight(LIMIT_FONT_SIZE);
  // Label centres: above a line, or under it; then moved apart where two would touch.
  const limitCentres = spreadLabels(
    allLimits.map((l) => ({ want: y(l.y) + (l.below ? 10 : -9), size: limitHeight })),
    plot.top,
    plot.bottom,
  );
  const drawing = (
    <Svg width={width} height={height}>
      <Rect
        x={plot.left}
        y={plot.top}
        width={plot.right - plot.left}
        height={plot.bottom - plot.top}
        fill={colors.surface}
      />
      {band ? (
        <Rect
          x={plot.left}
          width={plot.right - plot.left}
          y={y(band.max?.y ?? y.domain()[1])}
          height={Math.max(0, y(band.min?.y ?? y.domain()[0]) - y(band.max?.y ?? y.domain()[1]))}
          fill={colors.withinSoft}
        />
      ) : null}
      <ChartTicks x={xTicks} y={yTicks} plot={plot} />
      {y.domain()[0] < 0 ? (
        <Line x1={plot.left} x2={plot.right} y1={y(0)} y2={y(0)} stroke={colors.border} strokeWidth={1} />
      ) : null}
      {marker ? (
        <Line
          x1={x(marker.x)}
          x2={x(marker.x)}
          y1={plot.top}
          y2={plot.bottom}
          stroke={colors.accent}
          strokeWidth={1.5}
        />
      ) : null}
      {series.map((s) => (
        <SeriesLine key={s.label} series={s} x={x} y={y} marker={marker} d3={d3} />
      ))}
      {allLimits.map((l, k) => (
        <LimitLine
          key={l.label}
          label={l.label}
          y={y(l.y)}
          labelY={limitCentres[k] + 4}
          plot={plot}
          color={l.color}
        />
      ))}
      <AxisTitles xLabel={props.xLabel} yLabel={props.yLabel} plot={plot} height={height} />
    </Svg>
  );
  return { plot, x, y, drawing };
}

type Scale = Drawn['x'];

/** One series: its line, with gaps where a value is missing, and its dots when asked for. */
function SeriesLine({
  series: s,
  x,
  y,
  marker,
  d3,
}: {
  series: ChartSeries;
  x: Scale;
  y: Scale;
  marker: Props['marker'];
  d3: ChartD3;
}) {
  const n = Math.min(s.x.length, s.y.length);
  const indices = Array.from({ length: n }, (_, i) => i);
  const defined = (i: number) => finite(s.x[i]) && finite(s.y[i]);
  const d =
    d3
      .line<number>()
      .defined(defined)
      .x((i) => x(s.x[i]))
      .y((i) => y(s.y[i] ?? 0))(indices) ?? '';
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
        ? indices.filter(defined).map((i) => {
            const current = marker !== undefined && s.x[i] === marker.x;
            return (
              <Circle
                key={i}
                cx={x(s.x[i])}
                cy={y(s.y[i] ?? 0)}
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

type Readout = {
  /** px of the cursor. */
  at: number;
  lines: string[];
  /** Each series' point under the cursor, in px. */
  points: { x: number; y: number; color: string }[];
  sentence: string;
};

/**
 * What the cursor reads at rank `rank` of the first series: its x, and every series' value at its
 * nearest sample (the same sample where a series shares the first one's x).
 */
function readAt(props: Props, orders: number[][], primary: number, rank: number, drawn: Drawn): Readout {
  const { series } = props;
  const lead = series[primary];
  const i = orders[primary][rank];
  const xv = lead.x[i];
  const xText = props.xValue ? props.xValue(xv) : withUnit(xv, unitOf(props.xLabel));
  const yText = props.yValue ?? ((v: number) => withUnit(v, unitOf(props.yLabel)));
  const points: Readout['points'] = [];
  const values = series.flatMap((s, k) => {
    const j =
      s.x.length > i && s.x[i] === xv && finite(s.y[i]) ? i : orders[k][nearestRank(s.x, orders[k], xv)];
    const v = j === undefined ? null : s.y[j];
    if (j === undefined || !finite(v)) return [];
    points.push({ x: drawn.x(s.x[j]), y: drawn.y(v), color: s.color });
    return [`${s.label} ${yText(v)}`];
  });
  const xName = titleOf(props.xLabel);
  const lines = [`${xName} ${xText}`, ...values];
  return { at: drawn.x(xv), lines, points, sentence: `${xName} ${xText}: ${values.join(', ')}` };
}

/** The vertical cursor, a dot on each series, and the read-out box on the side with more room. */
function Cursor({ readout, plot, width }: { readout: Readout; plot: PlotBox; width: number }) {
  const onLeft = readout.at > (plot.left + plot.right) / 2;
  const side: ViewStyle = onLeft ? { right: width - readout.at + 8 } : { left: readout.at + 8 };
  const room = onLeft ? readout.at - 8 - plot.left : plot.right - readout.at - 8;
  return (
    <>
      <View
        style={[styles.cursor, { left: readout.at - 0.75, top: plot.top, height: plot.bottom - plot.top }]}
      />
      {readout.points.map((p, k) => (
        <View key={k} style={[styles.dot, { left: p.x - 5, top: p.y - 5, borderColor: p.color }]} />
      ))}
      <View
        testID="chart-readout"
        style={[styles.box, side, { top: plot.top + 4, maxWidth: Math.max(140, room) }]}
      >
        {readout.lines.map((l, k) => (
          <Text key={k} variant="small" style={k === 0 ? styles.boxHead : undefined}>
            {l}
          </Text>
        ))}
      </View>
    </>
  );
}

function Legend({ series }: { series: ChartSeries[] }) {
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

const finite = (v: number | null | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

/** The least and greatest finite value of several lists (NaN, NaN when there is none). */
function extent(lists: ArrayLike<number | null>[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const list of lists)
    for (let i = 0; i < list.length; i++) {
      const v = list[i];
      if (!finite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  return lo <= hi ? [lo, hi] : [Number.NaN, Number.NaN];
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

/** "Force (kN)" → "kN"; "" when the title names no unit. */
const unitOf = (title: string) => /\(([^()]+)\)\s*$/.exec(title)?.[1] ?? '';
/** "Force (kN)" → "Force". */
const titleOf = (title: string) => title.replace(/\s*\([^()]+\)\s*$/, '');

/** A value to four significant figures with its unit ("92.31°", "1.06 kN"). */
function withUnit(v: number, unit: string): string {
  const n = `${+v.toPrecision(4)}`;
  if (!unit) return n;
  return unit === '°' ? `${n}°` : `${n} ${unit}`;
}

const styles = StyleSheet.create({
  wrap: { width: '100%', gap: space.sm },
  plot: { width: '100%', cursor: 'crosshair', touchAction: 'pan-y' } as unknown as ViewStyle,
  noPointer: { ...StyleSheet.absoluteFill, pointerEvents: 'none' },
  cursor: { position: 'absolute', width: 1.5, backgroundColor: colors.text },
  dot: {
    position: 'absolute',
    width: 10,
    height: 10,
    borderRadius: 5,
    borderWidth: 2.5,
    backgroundColor: colors.surface,
  },
  box: {
    position: 'absolute',
    paddingHorizontal: space.sm,
    paddingVertical: space.xs,
    borderRadius: 6,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  boxHead: { fontFamily: fonts.semibold },
  offscreen: { position: 'absolute', width: 1, height: 1, overflow: 'hidden', opacity: 0 },
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, paddingLeft: space.xl },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
});
