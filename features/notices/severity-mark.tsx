import { looksOf, VocabularyMark } from '@/components/mark-icon';
import { findingSeverityVocabulary, type FindingSeverity } from '@/lib/vocabulary';

/**
 * A finding's severity as a mark: its own shape, its words and a colour from the vocabulary, so the
 * colour is never the only signal. The scale climbs grey ring → blue diamond → copper square with an
 * exclamation → solid red octagon with a bar; the label always says which one it is.
 */

/** Each label colour on its background reaches 4.5:1 (checked in tests/app/review-decision-marks). */
export const severityLook = looksOf(findingSeverityVocabulary);

export function SeverityMark({ severity, compact }: { severity: FindingSeverity; compact?: boolean }) {
  const word = findingSeverityVocabulary[severity];
  return <VocabularyMark word={word} accessibilityLabel={`Severity: ${word.label}`} compact={compact} />;
}
