import Svg, { Circle, Path, Rect } from 'react-native-svg';

import { MarkBadge } from '@/components/mark-badge';
import { colors } from '@/components/theme';
import { type FindingSeverity, severityInfo } from '@/features/review/schema';

/**
 * A finding's severity as a mark: its own shape, its label from `severityInfo` and a colour, so the
 * colour is never the only signal. The scale climbs grey ring → blue diamond → copper square with an
 * exclamation → solid red octagon with a bar; the label always says which one it is.
 */
type Look = { fg: string; bg: string; shape: 'ring' | 'diamond' | 'exclaim' | 'octagon' };

/** Each label colour on its background reaches 4.5:1 (checked in tests/app/review-decision-marks). */
export const severityLook: Record<FindingSeverity, Look> = {
  note: { fg: colors.textMuted, bg: colors.surfaceSunk, shape: 'ring' },
  fix_by_date: { fg: colors.base, bg: '#E3EEF8', shape: 'diamond' },
  fix_before_operation: { fg: colors.accent, bg: colors.accentSoft, shape: 'exclaim' },
  stop_now: { fg: colors.baseText, bg: colors.over, shape: 'octagon' },
};

export function SeverityShape({ severity, size = 14 }: { severity: FindingSeverity; size?: number }) {
  const look = severityLook[severity];
  // Drawn in the label's colour: on the solid stop-now mark that is white, with the bar cut out of it.
  const ink = look.fg;
  return (
    <Svg width={size} height={size} viewBox="0 0 14 14" accessibilityElementsHidden>
      {look.shape === 'ring' ? (
        <Circle cx={7} cy={7} r={5.2} stroke={ink} strokeWidth={2} fill="none" />
      ) : null}
      {look.shape === 'diamond' ? <Path d="M7 0.5 L13.5 7 L7 13.5 L0.5 7 Z" fill={ink} /> : null}
      {look.shape === 'exclaim' ? (
        <>
          <Rect x={1} y={1} width={12} height={12} rx={1.5} stroke={ink} strokeWidth={2} fill="none" />
          <Rect x={6} y={3.2} width={2} height={4.8} fill={ink} />
          <Rect x={6} y={9.2} width={2} height={2} fill={ink} />
        </>
      ) : null}
      {look.shape === 'octagon' ? (
        <>
          <Path d="M4.1 0.5 H9.9 L13.5 4.1 V9.9 L9.9 13.5 H4.1 L0.5 9.9 V4.1 Z" fill={ink} />
          <Rect x={3} y={6} width={8} height={2.2} fill={look.bg} />
        </>
      ) : null}
    </Svg>
  );
}

export function SeverityMark({ severity, compact }: { severity: FindingSeverity; compact?: boolean }) {
  const look = severityLook[severity];
  const label = severityInfo[severity].label;
  return (
    <MarkBadge
      shape={<SeverityShape severity={severity} />}
      label={label}
      fg={look.fg}
      bg={look.bg}
      accessibilityLabel={`Severity: ${label}`}
      compact={compact}
    />
  );
}
