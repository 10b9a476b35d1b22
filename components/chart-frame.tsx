import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { G, Line, Rect, Text as SvgText } from 'react-native-svg';

import { colors, fonts, space } from '@/components/theme';

type ChartMargin = { top: number; right: number; bottom: number; left: number };

/**
 * What every chart stands in: it measures its width (the scales need it, so the chart holds it), is read
 * as its summary instead of the drawing, keeps its height before the first measure, and tints the plot.
 */
export function ChartFrame({
  width,
  onWidth,
  height,
  margin: M,
  summary,
  legend,
  children,
}: {
  width: number;
  onWidth: (width: number) => void;
  height: number;
  margin: ChartMargin;
  summary: string;
  /** Under the drawing, e.g. the series' names. */
  legend?: ReactNode;
  /** The drawing over the plot's tint. */
  children: ReactNode;
}) {
  return (
    <View
      style={styles.wrap}
      onLayout={(e) => onWidth(e.nativeEvent.layout.width)}
      accessibilityLabel={summary}
      role="img"
    >
      {width > 0 ? (
        <Svg width={width} height={height}>
          <Rect
            x={M.left}
            y={M.top}
            width={width - M.left - M.right}
            height={height - M.top - M.bottom}
            fill={colors.surface}
          />
          {children}
        </Svg>
      ) : (
        <View style={{ height }} />
      )}
      {legend}
    </View>
  );
}

/**
 * A limit across the plot at pixel height `y`: dashed and labelled at its right end, so it never rests on
 * colour alone. `labelBelow` puts the label under the line (the lower side of a band).
 */
export function LimitLine({
  label,
  y,
  left,
  right,
  color = colors.over,
  labelBelow = false,
}: {
  label: string;
  y: number;
  left: number;
  right: number;
  color?: string;
  labelBelow?: boolean;
}) {
  return (
    <G>
      <Line x1={left} x2={right} y1={y} y2={y} stroke={color} strokeWidth={1.5} strokeDasharray="8 5" />
      <SvgText
        x={right - 4}
        y={labelBelow ? y + 14 : y - 5}
        fontSize={11}
        fontFamily={fonts.semibold}
        fill={color}
        textAnchor="end"
      >
        {label}
      </SvgText>
    </G>
  );
}

const styles = StyleSheet.create({
  wrap: { width: '100%', gap: space.sm },
});
