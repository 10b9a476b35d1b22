/**
 * What one period is, drawn: for a swinging arm, one full swing there and back (from passing a mark going
 * one way until passing it again going the same way); for a turning arm, one full revolution. Shown beside
 * every period or speed entry and on the tap timer, because "one swing" read as one pass gives half the
 * period and twice the rate.
 */
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, Line, Path, Polygon } from 'react-native-svg';

import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

type PeriodKind = 'swing' | 'revolution';

const periodDefinition: Record<PeriodKind, { title: string; text: string }> = {
  swing: {
    title: 'One swing = there and back',
    text:
      'Time from the arm passing your mark going one way until it passes the same mark going the same ' +
      'way again. One pass across the mark is only half a swing.',
  },
  revolution: {
    title: 'One revolution = a full turn',
    text: 'Time from the arm passing your mark until it passes the same mark again, all the way round.',
  },
};

const W = 120;
const H = 104;

/** An arrow head at (x, y) pointing along angle `a` (radians, screen coordinates). */
function head(x: number, y: number, a: number, size = 9): string {
  const p = (da: number) => `${x - size * Math.cos(a + da)},${y - size * Math.sin(a + da)}`;
  return `${x},${y} ${p(0.45)} ${p(-0.45)}`;
}

function SwingDrawing() {
  // Pivot at the top, the arm hanging over the mark (where a count starts and ends); around it the two
  // legs of one swing: out to one side (solid) and back to the other (dashed).
  const px = 60;
  const py = 10;
  const r = 60;
  const amp = 0.72;
  const at = (t: number, rr: number) => [px + rr * Math.sin(t), py + rr * Math.cos(t)] as const;
  const out = r + 14;
  const back = r + 27;
  const [ox0, oy0] = at(-amp, out);
  const [ox1, oy1] = at(amp, out);
  const [bx0, by0] = at(amp, back);
  const [bx1, by1] = at(-amp, back);
  return (
    <Svg width={W} height={H} viewBox={`0 0 ${W} ${H}`}>
      <Line x1={px} y1={py + r + 2} x2={px} y2={H} stroke={colors.accent} strokeWidth={3} />
      <Path
        d={`M ${ox0} ${oy0} A ${out} ${out} 0 0 0 ${ox1} ${oy1}`}
        stroke={colors.text}
        strokeWidth={2}
        fill="none"
      />
      {/* Tangent at the end of each leg: moving right (angle decreasing) and moving left. */}
      <Polygon points={head(ox1, oy1, -amp)} fill={colors.text} />
      <Path
        d={`M ${bx0} ${by0} A ${back} ${back} 0 0 1 ${bx1} ${by1}`}
        stroke={colors.text}
        strokeWidth={2}
        strokeDasharray="4 3"
        fill="none"
      />
      <Polygon points={head(bx1, by1, Math.PI + amp)} fill={colors.text} />
      <Line x1={px} y1={py} x2={px} y2={py + r} stroke={colors.base} strokeWidth={4} strokeLinecap="round" />
      <Circle cx={px} cy={py + r} r={8} fill={colors.base} />
      <Circle cx={px} cy={py} r={5} fill={colors.surface} stroke={colors.base} strokeWidth={3} />
    </Svg>
  );
}

function RevolutionDrawing() {
  const cx = 60;
  const cy = 52;
  const r = 36;
  const a0 = -Math.PI / 2 + 0.35;
  const a1 = -Math.PI / 2 - 0.35 + 2 * Math.PI;
  const pt = (a: number, rr = r + 9) => [cx + rr * Math.cos(a), cy + rr * Math.sin(a)] as const;
  const [sx, sy] = pt(a0);
  const [ex, ey] = pt(a1);
  return (
    <Svg width={W} height={H} viewBox={`0 0 ${W} ${H}`}>
      <Circle cx={cx} cy={cy} r={r} stroke={colors.border} strokeWidth={2} fill="none" />
      {/* The mark at the top, where the count starts and ends. */}
      <Line x1={cx} y1={cy - r - 14} x2={cx} y2={cy - r + 8} stroke={colors.accent} strokeWidth={3} />
      <Path
        d={`M ${sx} ${sy} A ${r + 9} ${r + 9} 0 1 1 ${ex} ${ey}`}
        stroke={colors.text}
        strokeWidth={2}
        fill="none"
      />
      <Polygon points={head(ex, ey, a1 + Math.PI / 2)} fill={colors.text} />
      <Line x1={cx} y1={cy} x2={cx} y2={cy - r} stroke={colors.base} strokeWidth={4} strokeLinecap="round" />
      <Circle cx={cx} cy={cy - r} r={7} fill={colors.base} />
      <Circle cx={cx} cy={cy} r={5} fill={colors.surface} stroke={colors.base} strokeWidth={3} />
    </Svg>
  );
}

/** The drawing with its definition in words beside it (the words carry the meaning; the drawing helps). */
export function MotionPicture({ kind, compact = false }: { kind: PeriodKind; compact?: boolean }) {
  const def = periodDefinition[kind];
  return (
    <View style={styles.root} accessibilityLabel={`${def.title}. ${def.text}`} role="img">
      {kind === 'swing' ? <SwingDrawing /> : <RevolutionDrawing />}
      <View style={styles.words}>
        <Text variant="heading">{def.title}</Text>
        {compact ? null : (
          <Text variant="small" muted>
            {def.text}
          </Text>
        )}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  root: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    padding: space.sm,
    borderRadius: radius.md,
    backgroundColor: colors.surfaceSunk,
  },
  words: { flex: 1, gap: 2 },
});
