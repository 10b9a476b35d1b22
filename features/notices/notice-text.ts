/**
 * The notice screens' words for kinds and e-mail deliveries, from the vocabulary (lib/vocabulary.ts), as
 * every other status word is.
 */
import {
  type FindingState,
  deliveryStatusVocabulary,
  labelsOf,
  noticeKindVocabulary,
} from '@/lib/vocabulary';
import { localDay } from '@/lib/dates';

export const noticeKindLabel = labelsOf(noticeKindVocabulary);

export const deliveryStatusLabel = labelsOf(deliveryStatusVocabulary);

/** Today as a calendar date (YYYY-MM-DD) on this device, to compare with due dates (lib/dates). */
export const todayIso = localDay;

/** A finding still open (or awaiting verification) after its due date. */
export const isPastDue = (f: { dueOn: string | null; state: FindingState }, today = todayIso()) =>
  f.dueOn !== null && f.state !== 'closed' && f.dueOn < today;
