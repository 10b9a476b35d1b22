import { looksOf, MarkIcon, VocabularyMark } from '@/components/mark-icon';
import { urgencyVocabulary, type Urgency } from '@/lib/vocabulary';

/**
 * Why an item is in the queue, drawn so that no two urgencies share a shape, and each shape comes with
 * its words and a colour pair of its own from the vocabulary: colour is never the only signal. The two
 * that mirror a load-check status keep that status's shape (over = barred square, near = triangle).
 */
export const urgencyLook = looksOf(urgencyVocabulary);

export function UrgencyIcon({ urgency, size = 14 }: { urgency: Urgency; size?: number }) {
  return <MarkIcon mark={urgencyVocabulary[urgency].mark} size={size} />;
}

/** The urgency as a small badge: shape, label, colour. */
export function UrgencyMark({ urgency, compact }: { urgency: Urgency; compact?: boolean }) {
  return <VocabularyMark word={urgencyVocabulary[urgency]} compact={compact} />;
}
