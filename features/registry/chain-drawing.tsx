import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, G, Line, Path, Polygon, Rect, Text as SvgText } from 'react-native-svg';

import { MarkShapes } from '@/components/mark-icon';
import { type EnvelopeStatus, envelopeStatusLabel } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, fonts, space } from '@/components/theme';
import type { CycleResult } from '@/features/loads/engine';
import {
  type Box,
  type ChainLayout,
  type Point,
  cgQuartersPath,
  chainLayout,
  drawingHeight,
  fitToView,
  niceLength,
  placeLabels,
} from '@/features/registry/chain-geometry';
import type { DesignData } from '@/features/loads/design-schema';
import { ICON_BOX } from '@/lib/mark-icons';
import { type UnitSystem, displayUnits, formatQuantity, fromSI, toSI } from '@/lib/units';
import { envelopeStatusVocabulary } from '@/lib/vocabulary';

/** The status's own colour (its mark's word colour in the vocabulary). */
const statusColor = (s: EnvelopeStatus) => colors[envelopeStatusVocabulary[s].mark.fg];

export type PivotPeak = { joint: number; forceN: number; status: EnvelopeStatus | null };

/** Each joint's peak force over the cycle and, when the design gives a force limit, its status. */
export function pivotPeaks(result: CycleResult): PivotPeak[] {
  return result.joints.map((j, i) => ({
    joint: i,
    forceN: j.peakForce.value,
    status: result.envelope.find((e) => e.id === `joints.${i}.force`)?.status ?? null,
  }));
}

const PAD = 56;
const BAR_SPACE = 28;
const LABEL_H = 22;
/** Width of one character of the 12.5 px mono label font, for sizing label boxes. */
const CHAR_W = 7.6;

/**
 * The ride's body chain drawn to scale: parts as lines and shapes, pivots as rings, each body's CG as the
 * quartered-circle symbol, seats as short spine ticks, and beside each pivot its peak force over the design
 * cycle with the envelope shape where a limit exists. The same scale on both axes, with a scale bar.
 */
export function ChainDrawing({
  data,
  pose,
  peaks,
  system,
  minHeight = 240,
  maxHeight = 420,
}: {
  data: DesignData;
  pose: readonly number[];
  peaks: PivotPeak[] | null;
  system: UnitSystem;
  minHeight?: number;
  maxHeight?: number;
}) {
  const [width, setWidth] = useState(0);
  const layout = useMemo(() => chainLayout(data, pose), [data, pose]);
  // Room for the scale bar under the chain.
  const height =
    width > 0 ? drawingHeight(layout.bounds, width, PAD, minHeight, maxHeight) + BAR_SPACE : minHeight;
  const summary = useMemo(() => describe(layout, peaks, system), [layout, peaks, system]);
  return (
    <View
      style={styles.wrap}
      onLayout={(e) => setWidth(e.nativeEvent.layout.width)}
      role="img"
      accessibilityLabel={summary}
      testID="chain-drawing"
    >
      {width > 0 ? (
        <Drawing layout={layout} peaks={peaks} system={system} width={width} height={height} />
      ) : (
        <View style={{ height }} />
      )}
      <Legend />
    </View>
  );
}

function Drawing({
  layout,
  peaks,
  system,
  width,
  height,
}: {
  layout: ChainLayout;
  peaks: PivotPeak[] | null;
  system: UnitSystem;
  width: number;
  height: number;
}) {
  const { scale, toScreen } = fitToView(layout.bounds, width, height - BAR_SPACE, PAD);
  const px = (p: Point) => toScreen(p);
  const bar = scaleBar(width, scale, system);
  const ground = px(layout.pivots[0]?.at ?? [0, 0]);
  const labels = layout.pivots.map((p) => {
    const peak = peaks?.find((q) => q.joint === p.joint);
    const text = `P${p.joint + 1}${peak ? `  ${formatQuantity(peak.forceN, 'force', system, { sig: 3 }).text}` : ''}`;
    const status = peak?.status ?? null;
    return { text, status, w: text.length * CHAR_W + (status ? 28 : 14), h: LABEL_H };
  });
  const boxes = placeLabels(
    layout.pivots.map((p) => px(p.at)),
    labels,
    width,
    height - BAR_SPACE,
  );

  return (
    <Svg width={width} height={height}>
      <Rect x={0} y={0} width={width} height={height} fill={colors.surface} />
      <GroundMark at={ground} />

      {layout.shapes.map((shape, k) => (
        <PartShape key={`s${k}`} shape={shape} px={px} scale={scale} />
      ))}

      {layout.seats.map((s, k) => {
        const a = px(s.at);
        // The tick points along the rider's spine; screen y is flipped.
        const b: [number, number] = [a[0] + s.spine[0] * 12, a[1] - s.spine[1] * 12];
        return (
          <G key={`seat${k}`}>
            <Line x1={a[0]} y1={a[1]} x2={b[0]} y2={b[1]} stroke={colors.accent} strokeWidth={2.5} />
            <Rect x={a[0] - 3.5} y={a[1] - 3.5} width={7} height={7} fill={colors.accent} />
          </G>
        );
      })}

      {layout.bodies.map((b) => {
        const c = px(b.cg);
        return (
          <G key={`cg${b.index}`}>
            <Circle cx={c[0]} cy={c[1]} r={8} fill={colors.surface} stroke={colors.text} strokeWidth={1.5} />
            <Path d={cgQuartersPath(c[0], c[1], 8)} fill={colors.text} />
          </G>
        );
      })}

      {layout.pivots.map((p) => {
        const c = px(p.at);
        return (
          <G key={`pv${p.joint}`}>
            <Circle cx={c[0]} cy={c[1]} r={9} fill={colors.surface} stroke={colors.base} strokeWidth={3} />
            <Circle cx={c[0]} cy={c[1]} r={2.5} fill={colors.base} />
          </G>
        );
      })}

      {labels.map((l, i) => (
        <PivotLabel key={`pl${i}`} box={boxes[i]} text={l.text} status={l.status} />
      ))}

      <ScaleBar bar={bar} height={height} />
    </Svg>
  );
}

/** The ground support under the first pivot. */
function GroundMark({ at: ground }: { at: Point }) {
  return (
    <>
      <Path
        d={`M ${ground[0]} ${ground[1]} L ${ground[0] - 14} ${ground[1] + 22} L ${ground[0] + 14} ${ground[1] + 22} Z`}
        fill={colors.surfaceSunk}
        stroke={colors.textMuted}
        strokeWidth={1.5}
      />
      <Line
        x1={ground[0] - 22}
        x2={ground[0] + 22}
        y1={ground[1] + 22}
        y2={ground[1] + 22}
        stroke={colors.textMuted}
        strokeWidth={2}
      />
    </>
  );
}

/** One part of a body as drawn: a rod, a round part, a plate or counterweight, or a point mass. */
function PartShape({
  shape: s,
  px,
  scale,
}: {
  shape: ChainLayout['shapes'][number];
  px: (p: Point) => Point;
  scale: number;
}) {
  if (s.kind === 'segment') {
    const [a, b] = [px(s.from), px(s.to)];
    return (
      <Line
        x1={a[0]}
        y1={a[1]}
        x2={b[0]}
        y2={b[1]}
        stroke={colors.base}
        strokeWidth={5}
        strokeLinecap="round"
      />
    );
  }
  if (s.kind === 'circle') {
    const c = px(s.centre);
    return (
      <Circle
        cx={c[0]}
        cy={c[1]}
        r={Math.max(2, s.radius * scale)}
        fill={s.solid ? colors.surfaceSunk : 'none'}
        fillOpacity={s.solid ? 0.8 : 0}
        stroke={colors.base}
        strokeWidth={s.solid ? 1.5 : 3}
      />
    );
  }
  if (s.kind === 'rect') {
    const pts = s.corners.map((c) => px(c).join(',')).join(' ');
    return (
      <Polygon
        points={pts}
        fill={s.counterweight ? colors.baseRaised : colors.surfaceSunk}
        fillOpacity={s.counterweight ? 0.85 : 0.9}
        stroke={colors.base}
        strokeWidth={1.5}
      />
    );
  }
  const c = px(s.at);
  return <Circle cx={c[0]} cy={c[1]} r={4} fill={colors.base} />;
}

function ScaleBar({ bar, height }: { bar: ReturnType<typeof scaleBar>; height: number }) {
  return (
    <G>
      <Line x1={16} x2={16 + bar.px} y1={height - 14} y2={height - 14} stroke={colors.text} strokeWidth={2} />
      <Line x1={16} x2={16} y1={height - 19} y2={height - 9} stroke={colors.text} strokeWidth={2} />
      <Line
        x1={16 + bar.px}
        x2={16 + bar.px}
        y1={height - 19}
        y2={height - 9}
        stroke={colors.text}
        strokeWidth={2}
      />
      <SvgText x={24 + bar.px} y={height - 10} fontSize={12} fontFamily={fonts.mono} fill={colors.text}>
        {bar.label}
      </SvgText>
    </G>
  );
}

/** "P1  412 kN" in a white box beside its pivot, framed in the status colour when a limit exists. */
function PivotLabel({ box, text, status }: { box: Box; text: string; status: EnvelopeStatus | null }) {
  const colour = status ? statusColor(status) : colors.text;
  return (
    <G>
      <Rect
        x={box.x}
        y={box.y}
        width={box.w}
        height={box.h}
        rx={4}
        fill={colors.surface}
        stroke={status ? colour : colors.border}
        strokeWidth={1.5}
      />
      {status ? <StatusShape status={status} x={box.x + 7} y={box.y + 5} /> : null}
      <SvgText
        x={box.x + (status ? 23 : 7)}
        y={box.y + 15.5}
        fontSize={12.5}
        fontFamily={fonts.mono}
        fill={status && status !== 'within' ? colour : colors.text}
      >
        {text}
      </SvgText>
    </G>
  );
}

/** The envelope status's mark (as on every status badge), 12 px square, drawn inside the SVG. */
function StatusShape({ status, x, y }: { status: EnvelopeStatus; x: number; y: number }) {
  return (
    <G transform={`translate(${x} ${y}) scale(${12 / ICON_BOX})`}>
      <MarkShapes mark={envelopeStatusVocabulary[status].mark} />
    </G>
  );
}

/** A round length about a fifth of the drawing's width, in the person's length unit. */
function scaleBar(width: number, scale: number, system: UnitSystem): { px: number; label: string } {
  const unit = displayUnits('length', system)[0];
  const targetM = (width * 0.2) / scale;
  const nice = niceLength(fromSI(targetM, 'length', unit.mathjs));
  const metres = toSI(nice, 'length', unit.mathjs);
  return { px: metres * scale, label: `${nice} ${unit.label}` };
}

function describe(layout: ChainLayout, peaks: PivotPeak[] | null, system: UnitSystem): string {
  const pivots = layout.pivots
    .map((p) => {
      const peak = peaks?.find((q) => q.joint === p.joint);
      const force = peak
        ? `, peak force ${formatQuantity(peak.forceN, 'force', system, { sig: 3 }).text}`
        : '';
      const status = peak?.status ? `, ${envelopeStatusLabel(peak.status)}` : '';
      return `P${p.joint + 1} ${p.name}${force}${status}`;
    })
    .join('; ');
  return `Body chain drawn to scale: ${layout.bodies.length} ${layout.bodies.length === 1 ? 'body' : 'bodies'}, ${layout.seats.length} seats. Pivots: ${pivots}.`;
}

function Legend() {
  return (
    <View style={styles.legend} accessibilityElementsHidden importantForAccessibility="no-hide-descendants">
      <LegendItem label="Pivot">
        <Circle cx={9} cy={9} r={6.5} fill={colors.surface} stroke={colors.base} strokeWidth={2.5} />
        <Circle cx={9} cy={9} r={2} fill={colors.base} />
      </LegendItem>
      <LegendItem label="Centre of gravity">
        <Circle cx={9} cy={9} r={6.5} fill={colors.surface} stroke={colors.text} strokeWidth={1.5} />
        <Path d={cgQuartersPath(9, 9, 6.5)} fill={colors.text} />
      </LegendItem>
      <LegendItem label="Seat (tick = spine)">
        <Line x1={9} y1={10} x2={9} y2={1} stroke={colors.accent} strokeWidth={2.5} />
        <Rect x={5.5} y={9} width={7} height={7} fill={colors.accent} />
      </LegendItem>
      <LegendItem label="Counterweight">
        <Rect x={2} y={4} width={14} height={10} fill={colors.baseRaised} stroke={colors.base} />
      </LegendItem>
    </View>
  );
}

function LegendItem({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <View style={styles.legendItem}>
      <Svg width={18} height={18}>
        {children}
      </Svg>
      <Text variant="small" muted>
        {label}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { width: '100%', gap: space.sm },
  legend: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg, rowGap: space.xs },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
});
