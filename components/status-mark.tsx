import Svg, { Circle, Path, Rect } from 'react-native-svg';

import { MarkBadge } from '@/components/mark-badge';
import { colors } from '@/components/theme';

/**
 * Status marks carry colour, shape and a text label together, so colour is never the only signal.
 * Envelope: within = disc, near = triangle, over = square with a bar.
 * Ride: in service = disc, restricted = triangle, out of service = square with a bar.
 */
export type EnvelopeStatus = 'within' | 'near' | 'over';
export type RideStatus = 'in_service' | 'restricted' | 'out_of_service';
type Shape = 'disc' | 'triangle' | 'barred';

const envelope: Record<EnvelopeStatus, { label: string; shape: Shape; fg: string; bg: string }> = {
  within: { label: 'Within', shape: 'disc', fg: colors.within, bg: colors.withinSoft },
  near: { label: 'Near limit', shape: 'triangle', fg: colors.near, bg: colors.nearSoft },
  over: { label: 'Over limit', shape: 'barred', fg: colors.over, bg: colors.overSoft },
};

const ride: Record<RideStatus, { label: string; shape: Shape; fg: string; bg: string }> = {
  in_service: { label: 'In service', shape: 'disc', fg: colors.within, bg: colors.withinSoft },
  restricted: { label: 'Restricted', shape: 'triangle', fg: colors.near, bg: colors.nearSoft },
  out_of_service: { label: 'Out of service', shape: 'barred', fg: colors.over, bg: colors.overSoft },
};

export const envelopeStatusLabel = (s: EnvelopeStatus) => envelope[s].label;
export const rideStatusLabel = (s: RideStatus) => ride[s].label;

function ShapeIcon({ shape, color, size = 14 }: { shape: Shape; color: string; size?: number }) {
  return (
    <Svg width={size} height={size} viewBox="0 0 14 14" accessibilityElementsHidden>
      {shape === 'disc' ? <Circle cx={7} cy={7} r={6} fill={color} /> : null}
      {shape === 'triangle' ? <Path d="M7 1 L13.5 13 L0.5 13 Z" fill={color} /> : null}
      {shape === 'barred' ? (
        <>
          <Rect x={1} y={1} width={12} height={12} rx={2} fill={color} />
          <Rect x={3} y={6} width={8} height={2.2} fill="#FFFFFF" />
        </>
      ) : null}
    </Svg>
  );
}

function Mark({ spec, compact }: { spec: (typeof envelope)['within']; compact?: boolean }) {
  return (
    <MarkBadge
      shape={<ShapeIcon shape={spec.shape} color={spec.fg} />}
      label={spec.label}
      fg={spec.fg}
      bg={spec.bg}
      accessibilityLabel={spec.label}
      compact={compact}
    />
  );
}

export function EnvelopeMark({ status, compact }: { status: EnvelopeStatus; compact?: boolean }) {
  return <Mark spec={envelope[status]} compact={compact} />;
}

export function RideStatusMark({ status, compact }: { status: RideStatus; compact?: boolean }) {
  return <Mark spec={ride[status]} compact={compact} />;
}
