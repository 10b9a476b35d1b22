import Svg, { Circle, Path, Rect } from 'react-native-svg';

import { MarkBadge } from '@/components/mark-badge';
import { colors } from '@/components/theme';
import { type NoticeDeliveryState, noticeDeliveryStateInfo } from '@/features/notices/schema';

/**
 * Where a notice's e-mail stands, as a mark: the words of `noticeDeliveryStateInfo`, a shape and a
 * colour. Sent is a filled disc with a tick, sending a clock face, partly sent a triangle, not delivered
 * a square with a bar, and no address an empty square with a dash.
 */
type Look = { fg: string; bg: string; shape: 'tick' | 'clock' | 'triangle' | 'barred' | 'empty' };

/** Each label colour on its background reaches 4.5:1 (checked in tests/app/notice-marks.test.tsx). */
export const deliveryLook: Record<NoticeDeliveryState, Look> = {
  sent: { fg: colors.within, bg: colors.withinSoft, shape: 'tick' },
  sending: { fg: '#1A5F9E', bg: '#E3EEF8', shape: 'clock' },
  partly_sent: { fg: colors.near, bg: colors.nearSoft, shape: 'triangle' },
  failed: { fg: colors.over, bg: colors.overSoft, shape: 'barred' },
  no_address: { fg: colors.textMuted, bg: colors.surfaceSunk, shape: 'empty' },
};

function DeliveryShape({ state, size = 14 }: { state: NoticeDeliveryState; size?: number }) {
  const { fg, bg, shape } = deliveryLook[state];
  return (
    <Svg width={size} height={size} viewBox="0 0 14 14" accessibilityElementsHidden>
      {shape === 'tick' ? (
        <>
          <Circle cx={7} cy={7} r={6.5} fill={fg} />
          <Path
            d="M3.8 7.2 L6 9.4 L10.2 4.8"
            stroke={bg}
            strokeWidth={1.9}
            fill="none"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </>
      ) : null}
      {shape === 'clock' ? (
        <>
          <Circle cx={7} cy={7} r={5.8} stroke={fg} strokeWidth={1.8} fill="none" />
          <Path d="M7 3.6 V7 L9.4 8.6" stroke={fg} strokeWidth={1.6} fill="none" strokeLinecap="round" />
        </>
      ) : null}
      {shape === 'triangle' ? <Path d="M7 1 L13.5 13 L0.5 13 Z" fill={fg} /> : null}
      {shape === 'barred' ? (
        <>
          <Rect x={1} y={1} width={12} height={12} rx={2} fill={fg} />
          <Rect x={3} y={6} width={8} height={2.2} fill={bg} />
        </>
      ) : null}
      {shape === 'empty' ? (
        <>
          <Rect x={1.5} y={1.5} width={11} height={11} rx={2} stroke={fg} strokeWidth={1.8} fill="none" />
          <Rect x={4} y={6.1} width={6} height={1.8} fill={fg} />
        </>
      ) : null}
    </Svg>
  );
}

export function NoticeDeliveryMark({ state }: { state: NoticeDeliveryState }) {
  const look = deliveryLook[state];
  const { label } = noticeDeliveryStateInfo[state];
  return (
    <MarkBadge
      shape={<DeliveryShape state={state} />}
      label={label}
      fg={look.fg}
      bg={look.bg}
      accessibilityLabel={`E-mail: ${label}`}
      compact
    />
  );
}
