import { looksOf, VocabularyMark } from '@/components/mark-icon';
import { findingStateVocabulary, type FindingState } from '@/lib/vocabulary';

/**
 * Where a finding stands, as a mark: the words, a shape and a colour from the vocabulary, so the colour is
 * never the only signal. The shapes follow the loop round: a ring with a dot (open), a half-filled ring
 * (the operator reported a corrective action), a filled disc with a tick (verified and closed).
 */

/** Each label colour on its background reaches 4.5:1 (checked in tests/app/notice-marks.test.tsx). */
export const findingStateLook = looksOf(findingStateVocabulary);

export function FindingStateMark({ state }: { state: FindingState }) {
  const word = findingStateVocabulary[state];
  return <VocabularyMark word={word} accessibilityLabel={`State: ${word.label}`} compact />;
}
