import { VocabularyMark } from '@/components/mark-icon';
import {
  envelopeStatusVocabulary,
  rideStatusVocabulary,
  type EnvelopeStatus,
  type RideStatus,
} from '@/lib/vocabulary';

/**
 * Status marks carry colour, shape and a text label together, so colour is never the only signal. Words,
 * shapes and colours are the vocabulary's (lib/vocabulary.ts):
 * Envelope: within = disc, near = triangle, over = square with a bar.
 * Ride: in service = disc, restricted = triangle, out of service = square with a bar.
 */
export type { EnvelopeStatus, RideStatus };

export const envelopeStatusLabel = (s: EnvelopeStatus) => envelopeStatusVocabulary[s].label;
export const rideStatusLabel = (s: RideStatus) => rideStatusVocabulary[s].label;

export function EnvelopeMark({ status, compact }: { status: EnvelopeStatus; compact?: boolean }) {
  return <VocabularyMark word={envelopeStatusVocabulary[status]} compact={compact} />;
}

export function RideStatusMark({ status, compact }: { status: RideStatus; compact?: boolean }) {
  return <VocabularyMark word={rideStatusVocabulary[status]} compact={compact} />;
}
