import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Line, Polyline } from 'react-native-svg';

import { colors } from '@/components/theme';

/**
 * A light trace of a rate against time: one polyline, a zero line, nothing else, cheap enough to redraw
 * with every batch of readings while recording. At most `maxPoints` points are drawn (every k-th sample).
 */
export function RateTrace({
  timeS,
  values,
  height = 120,
  summary,
  maxPoints = 400,
}: {
  timeS: readonly number[];
  values: readonly number[];
  height?: number;
  summary: string;
  maxPoints?: number;
}) {
  const [width, setWidth] = useState(0);
  const n = Math.min(timeS.length, values.length);
  let points = '';
  let zeroY = height / 2;
  if (n > 1 && width > 0) {
    const step = Math.max(1, Math.ceil(n / maxPoints));
    const t0 = timeS[0];
    const span = timeS[n - 1] - t0 || 1;
    let peak = 1e-9;
    for (let k = 0; k < n; k++) peak = Math.max(peak, Math.abs(values[k]));
    const pad = 6;
    const y = (v: number) => height / 2 - (v / peak) * (height / 2 - pad);
    zeroY = y(0);
    const parts: string[] = [];
    for (let k = 0; k < n; k += step)
      parts.push(`${(((timeS[k] - t0) / span) * width).toFixed(1)},${y(values[k]).toFixed(1)}`);
    points = parts.join(' ');
  }
  return (
    <View
      style={[styles.wrap, { height }]}
      onLayout={(e) => setWidth(e.nativeEvent.layout.width)}
      role="img"
      accessibilityLabel={summary}
    >
      {width > 0 ? (
        <Svg width={width} height={height}>
          <Line x1={0} x2={width} y1={zeroY} y2={zeroY} stroke={colors.border} strokeDasharray="4 4" />
          {points ? <Polyline points={points} fill="none" stroke={colors.base} strokeWidth={2} /> : null}
        </Svg>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { width: '100%', backgroundColor: colors.surfaceSunk, borderRadius: 6, overflow: 'hidden' },
});
