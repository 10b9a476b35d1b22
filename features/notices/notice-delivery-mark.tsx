import { looksOf, VocabularyMark } from '@/components/mark-icon';
import { noticeDeliveryStateVocabulary, type NoticeDeliveryState } from '@/lib/vocabulary';

/**
 * Where a notice's e-mail stands, as a mark: the words, a shape and a colour from the vocabulary. Sent is
 * a filled disc with a tick, sending a clock face, partly sent a triangle, not delivered a square with a
 * bar, and no address an empty square with a dash.
 */

/** Each label colour on its background reaches 4.5:1 (checked in tests/app/notice-marks.test.tsx). */
export const deliveryLook = looksOf(noticeDeliveryStateVocabulary);

export function NoticeDeliveryMark({ state }: { state: NoticeDeliveryState }) {
  const word = noticeDeliveryStateVocabulary[state];
  return <VocabularyMark word={word} accessibilityLabel={`E-mail: ${word.label}`} compact />;
}
