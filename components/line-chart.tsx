import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Line, Path } from 'react-native-svg';

import { AxisTitles, ChartTicks } from '@/components/chart-axes';
import { useChartD3 } from '@/components/chart-d3-loader';
import { ChartFrame, LimitLine } from '@/components/chart-frame';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';

type ChartSeries = {
  label: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  color: string;
  dashed?: boolean;
};
type ChartLimit = { label: string; y: number; color?: string };

type Props = {
  series: ChartSeries[];
  limits?: ChartLimit[];
  xLabel: string;
  yLabel: string;
  height?: number;
  /** Fixed x domain (e.g. [0, 360] for angle), else the data's extent. */
  xDomain?: [number, number];
  xTicks?: number[];
  /** Accessible summary read instead of the drawing. */
  summary: string;
};

const M = { top: 12, right: 16, bottom: 40, left: 60 };

/**
 * A line chart drawn with react-native-svg, scales and paths from d3 (d3-scale, d3-shape; on the web
 * loaded with the first chart, see chart-d3-loader.web.ts).
 * Limit lines are dashed and labelled, so a limit never depends on colour alone.
 */
export function LineChart({
  series,
  limits = [],
  xLabel,
  yLabel,
  height = 240,
  xDomain,
  xTicks,
  summary,
}: Props) {
  const [width, setWidth] = useState(0);
  const d3 = useChartD3();
  const legend =
    series.length > 1 ? (
      <View style={styles.legend}>
        {series.map((s) => (
          <View key={s.label} style={styles.legendItem}>
            <View style={[styles.swatch, { backgroundColor: s.color }, s.dashed && styles.swatchDashed]} />
            <Text variant="small">{s.label}</Text>
          </View>
        ))}
      </View>
    ) : null;
  const frame = { onWidth: setWidth, height, margin: M, summary, legend };
  // Until d3 is here the frame stays as before its first measure: its height, legend and summary.
  if (!d3)
    return (
      <ChartFrame {...frame} width={0}>
        {null}
      </ChartFrame>
    );
  const xs = series.flatMap((s) => Array.from(s.x));
  const ys = [...series.flatMap((s) => Array.from(s.y)), ...limits.map((l) => l.y)];
  const xExtent: [number, number] = xDomain ?? [Math.min(...xs), Math.max(...xs)];
  const yMin = Math.min(0, ...ys);
  const yMax = Math.max(...ys, 1e-9);
  const x = d3
    .scaleLinear()
    .domain(xExtent)
    .range([M.left, Math.max(M.left + 10, width - M.right)]);
  const y = d3
    .scaleLinear()
    .domain([yMin, yMax * 1.08])
    .nice()
    .range([height - M.bottom, M.top]);

  return (
    <ChartFrame {...frame} width={width}>
      <ChartTicks
        x={x}
        y={y}
        xTicks={xTicks ?? x.ticks(6)}
        yTicks={y.ticks(5)}
        xFormat={compact}
        yFormat={compact}
        width={width}
        height={height}
        margin={M}
      />
      <Line x1={M.left} x2={width - M.right} y1={y(0)} y2={y(0)} stroke={colors.border} strokeWidth={1} />
      {series.map((s) => {
        const pts = Array.from(s.x, (xv, i) => [x(xv), y(s.y[i])] as [number, number]);
        const d = d3.line()(pts) ?? '';
        return (
          <Path
            key={s.label}
            d={d}
            stroke={s.color}
            strokeWidth={2}
            fill="none"
            strokeDasharray={s.dashed ? '6 4' : undefined}
          />
        );
      })}
      {limits.map((l) => (
        <LimitLine
          key={l.label}
          label={l.label}
          y={y(l.y)}
          left={M.left}
          right={width - M.right}
          color={l.color}
        />
      ))}
      <AxisTitles xLabel={xLabel} yLabel={yLabel} width={width} height={height} margin={M} />
    </ChartFrame>
  );
}

function compact(v: number): string {
  const a = Math.abs(v);
  if (a >= 1e6) return `${+(v / 1e6).toFixed(1)}M`;
  if (a >= 1e4) return `${+(v / 1e3).toFixed(0)}k`;
  return `${+v.toFixed(2)}`;
}

const styles = StyleSheet.create({
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, paddingLeft: M.left },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  swatch: { width: 16, height: 3, borderRadius: 2 },
  swatchDashed: { opacity: 0.6 },
});
