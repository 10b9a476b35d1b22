import Svg, { Circle, Line, Path, Rect } from 'react-native-svg';

import { MarkBadge } from '@/components/mark-badge';
import { colors } from '@/components/theme';
import { ICON_BOX, iconParts, type IconPart, type MarkIconName, type Paint } from '@/lib/mark-icons';
import type { Mark } from '@/lib/vocabulary';

/**
 * The vocabulary's marks on screen: the drawing of `lib/mark-icons.ts` painted in the mark's colours.
 * The server's PDF paints the same drawing (`server/pdf/marks.ts`); tests/app/vocabulary-marks.test.tsx
 * checks that both put down the same shapes in the same colours for every state.
 */

/** A state's words and mark as a screen uses them: its icon's name and its colours as values. */
type MarkLook = { label: string; shape: MarkIconName; fg: string; bg: string };

const lookOf = (word: { label: string; mark: Mark }): MarkLook => ({
  label: word.label,
  shape: word.mark.icon,
  fg: colors[word.mark.fg],
  bg: colors[word.mark.bg],
});

/** The looks of a whole vocabulary table, keyed as the table is. */
export function looksOf<K extends string>(
  table: Record<K, { label: string; mark: Mark }>,
): Record<K, MarkLook> {
  return Object.fromEntries(
    Object.entries<{ label: string; mark: Mark }>(table).map(([k, w]) => [k, lookOf(w)]),
  ) as Record<K, MarkLook>;
}

function IconPartView({ part, paint }: { part: IconPart; paint: (p: Paint) => string }) {
  const stroke = part.stroke ? paint(part.stroke) : undefined;
  const line = {
    stroke,
    strokeWidth: part.strokeWidth,
    strokeLinecap: part.lineCap,
    strokeLinejoin: part.lineJoin,
  };
  const fill = 'fill' in part && part.fill ? paint(part.fill) : 'none';
  switch (part.kind) {
    case 'circle':
      return <Circle cx={part.cx} cy={part.cy} r={part.r} fill={fill} {...line} />;
    case 'rect':
      return (
        <Rect
          x={part.x}
          y={part.y}
          width={part.width}
          height={part.height}
          rx={part.rx}
          fill={fill}
          {...line}
        />
      );
    case 'path':
      return <Path d={part.d} fill={fill} {...line} />;
    case 'line':
      return <Line x1={part.x1} y1={part.y1} x2={part.x2} y2={part.y2} {...line} />;
  }
}

/** A mark's shapes in its 14-unit box, for drawings that place them inside their own SVG. */
export function MarkShapes({ mark }: { mark: Mark }) {
  const paint = (p: Paint) => (p === 'white' ? colors.surface : colors[mark[p]]);
  return (
    <>
      {iconParts(mark.icon).map((part, i) => (
        <IconPartView key={i} part={part} paint={paint} />
      ))}
    </>
  );
}

/** A mark's icon, `size` px square, hidden from screen readers (the words beside it say the state). */
export function MarkIcon({ mark, size = 14 }: { mark: Mark; size?: number }) {
  return (
    <Svg
      width={size}
      height={size}
      viewBox={`0 0 ${ICON_BOX} ${ICON_BOX}`}
      // Hidden from assistive technology everywhere: the words beside it say the same (on the web an
      // svg left in a control counts against its name, WCAG 2.5.3).
      aria-hidden
      accessibilityElementsHidden
      importantForAccessibility="no"
    >
      <MarkShapes mark={mark} />
    </Svg>
  );
}

/** A state as a badge: its icon and words in its colours, read out as `accessibilityLabel` (default: the words). */
export function VocabularyMark({
  word,
  accessibilityLabel,
  compact,
}: {
  word: { label: string; mark: Mark };
  accessibilityLabel?: string;
  compact?: boolean;
}) {
  const look = lookOf(word);
  return (
    <MarkBadge
      shape={<MarkIcon mark={word.mark} />}
      label={look.label}
      fg={look.fg}
      bg={look.bg}
      accessibilityLabel={accessibilityLabel ?? look.label}
      compact={compact}
    />
  );
}
