/**
 * The words the server prints on notices and e-mails that are not the vocabulary's. Status, role and
 * severity words come from lib/vocabulary.ts, the caution from lib/caution-text.ts.
 */
import type { NoticeDocument } from '@/features/notices/schema';
import { colors } from '@/lib/colors';
import { labelsOf, rideStatusVocabulary, roleVocabulary } from '@/lib/vocabulary';

export const rideStatusWords = labelsOf(rideStatusVocabulary);

export const roleWords = labelsOf(roleVocabulary);

/** How the operator can disagree with a notice; our own wording. */
export function appealText(issuerName: string, reference: string): string {
  return (
    `If you disagree with this notice, write to ${issuerName} within 14 days of its date, quoting ` +
    `${reference}, and say which findings you dispute and why; include any evidence you rely on. ` +
    'A disagreement does not lift a stop or out-of-service order: the ride stays as this notice states ' +
    'until the findings are verified closed or the order is withdrawn in writing.'
  );
}

/** "PW-2026-0007", sequential within the year. */
export const noticeReference = (year: number, seq: number) => `PW-${year}-${String(seq).padStart(4, '0')}`;

/** The e-mail's subject line: the reference first, so it can be searched for and filed. */
export function noticeSubject(doc: Pick<NoticeDocument, 'reference' | 'kind' | 'ride' | 'operatingStatus'>) {
  const what =
    doc.kind === 'inspection'
      ? 'inspection notice'
      : `ride status: ${rideStatusWords[doc.operatingStatus.status].toLowerCase()}`;
  return `${doc.reference} · ${doc.ride.name} · ${what}`;
}

/** A value as printed, or the words for its absence. */
export const orNot = (v: string | number | null | undefined, missing = 'Not recorded') =>
  v === null || v === undefined || v === '' ? missing : String(v);

/** The opening of every HTML e-mail: the page in the palette's base colour (lib/colors). */
export const htmlMailStart = `<!doctype html><html><body style="font-family: sans-serif; color: ${colors.base}; line-height: 1.4">`;

/** HTML-escapes text for the e-mail bodies. */
export function escapeHtml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}
