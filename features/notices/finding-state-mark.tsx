import Svg, { Circle, Path } from 'react-native-svg';

import { MarkBadge } from '@/components/mark-badge';
import { colors } from '@/components/theme';
import type { FindingState } from '@/features/review/schema';

/**
 * Where a finding stands, as a mark: the words, a shape and a colour, so the colour is never the only
 * signal. The shapes follow the loop round: an open circle with a dot (open), a half-filled circle (the
 * operator reported a corrective action), a filled circle with a tick (verified and closed).
 */
type Look = { label: string; fg: string; bg: string; shape: 'open' | 'half' | 'done' };

/** Each label colour on its background reaches 4.5:1 (checked in tests/app/notice-marks.test.tsx). */
export const findingStateLook: Record<FindingState, Look> = {
  open: { label: 'Open', fg: colors.text, bg: colors.surfaceSunk, shape: 'open' },
  action_reported: { label: 'Action reported', fg: '#1A5F9E', bg: '#E3EEF8', shape: 'half' },
  closed: { label: 'Closed', fg: colors.within, bg: colors.withinSoft, shape: 'done' },
};

export const findingStateLabel = (s: FindingState) => findingStateLook[s].label;

export function FindingStateShape({ state, size = 14 }: { state: FindingState; size?: number }) {
  const { fg, bg, shape } = findingStateLook[state];
  return (
    <Svg width={size} height={size} viewBox="0 0 14 14" accessibilityElementsHidden>
      {shape === 'open' ? (
        <>
          <Circle cx={7} cy={7} r={5.8} stroke={fg} strokeWidth={1.8} fill="none" />
          <Circle cx={7} cy={7} r={1.8} fill={fg} />
        </>
      ) : null}
      {shape === 'half' ? (
        <>
          <Circle cx={7} cy={7} r={5.8} stroke={fg} strokeWidth={1.8} fill="none" />
          <Path d="M7 1.2 A5.8 5.8 0 0 1 7 12.8 Z" fill={fg} />
        </>
      ) : null}
      {shape === 'done' ? (
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
    </Svg>
  );
}

export function FindingStateMark({ state }: { state: FindingState }) {
  const look = findingStateLook[state];
  return (
    <MarkBadge
      shape={<FindingStateShape state={state} />}
      label={look.label}
      fg={look.fg}
      bg={look.bg}
      accessibilityLabel={`State: ${look.label}`}
      compact
    />
  );
}
