import Svg, { Circle, Line, Path, Rect } from 'react-native-svg';

import { MarkBadge } from '@/components/mark-badge';
import { type Urgency, urgencyInfo } from '@/features/review/schema';

/**
 * Why an item is in the queue, drawn so that no two urgencies share a shape, and each shape comes with
 * its words from `urgencyInfo` and a colour pair of its own: colour is never the only signal. The two
 * that mirror a load-check status keep that status's shape (over = barred square, near = triangle).
 */
export type UrgencyShape = 'barred' | 'crossed' | 'triangle' | 'clock' | 'diamond' | 'ring';

export const urgencyLook: Record<Urgency, { shape: UrgencyShape; fg: string; bg: string }> = {
  over: { shape: 'barred', fg: '#B0231A', bg: '#FBE3E1' },
  failed: { shape: 'crossed', fg: '#9B1D58', bg: '#F9E3EE' },
  near: { shape: 'triangle', fg: '#8A5A00', bg: '#FCF0D6' },
  overdue: { shape: 'clock', fg: '#4A3B98', bg: '#ECE9F8' },
  past_due: { shape: 'diamond', fg: '#9A3D0F', bg: '#FBE9DE' },
  awaiting: { shape: 'ring', fg: '#35505F', bg: '#E8ECEE' },
};

export function UrgencyIcon({ urgency, size = 14 }: { urgency: Urgency; size?: number }) {
  const { shape, fg } = urgencyLook[urgency];
  return (
    <Svg
      width={size}
      height={size}
      viewBox="0 0 14 14"
      accessibilityElementsHidden
      importantForAccessibility="no"
    >
      {shape === 'barred' ? (
        <>
          <Rect x={1} y={1} width={12} height={12} rx={2} fill={fg} />
          <Rect x={3} y={6} width={8} height={2.2} fill="#FFFFFF" />
        </>
      ) : null}
      {shape === 'crossed' ? (
        <>
          <Circle cx={7} cy={7} r={6.5} fill={fg} />
          <Line x1={4.4} y1={4.4} x2={9.6} y2={9.6} stroke="#FFFFFF" strokeWidth={2} strokeLinecap="round" />
          <Line x1={9.6} y1={4.4} x2={4.4} y2={9.6} stroke="#FFFFFF" strokeWidth={2} strokeLinecap="round" />
        </>
      ) : null}
      {shape === 'triangle' ? <Path d="M7 1 L13.5 13 L0.5 13 Z" fill={fg} /> : null}
      {shape === 'clock' ? (
        <>
          <Circle cx={7} cy={7} r={5.6} fill="none" stroke={fg} strokeWidth={1.8} />
          <Path d="M7 3.8 L7 7.2 L9.6 8.6" fill="none" stroke={fg} strokeWidth={1.6} strokeLinecap="round" />
        </>
      ) : null}
      {shape === 'diamond' ? (
        <>
          <Path d="M7 0.5 L13.5 7 L7 13.5 L0.5 7 Z" fill={fg} />
          <Rect x={6.1} y={3.6} width={1.8} height={4.4} fill="#FFFFFF" />
          <Rect x={6.1} y={9} width={1.8} height={1.6} fill="#FFFFFF" />
        </>
      ) : null}
      {shape === 'ring' ? <Circle cx={7} cy={7} r={5.4} fill="none" stroke={fg} strokeWidth={2.2} /> : null}
    </Svg>
  );
}

/** The urgency as a small badge: shape, label, colour. */
export function UrgencyMark({ urgency, compact }: { urgency: Urgency; compact?: boolean }) {
  const look = urgencyLook[urgency];
  const label = urgencyInfo[urgency].label;
  return (
    <MarkBadge
      shape={<UrgencyIcon urgency={urgency} />}
      label={label}
      fg={look.fg}
      bg={look.bg}
      accessibilityLabel={label}
      compact={compact}
    />
  );
}
