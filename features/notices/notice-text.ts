/**
 * The words of the notice screens in one place: kinds and e-mail deliveries. Severity, finding-state,
 * envelope and ride-status words come from their own definitions (severityInfo and the marks).
 */
import type { NoticeDelivery, NoticeKind } from '@/features/notices/schema';
import type { FindingState } from '@/features/review/schema';

export const noticeKindLabel: Record<NoticeKind, string> = {
  inspection: 'Inspection notice',
  status_change: 'Ride status notice',
};

export const deliveryStatusLabel: Record<NoticeDelivery['status'], string> = {
  pending: 'Waiting to send',
  sending: 'Sending',
  sent: 'Sent',
  failed: 'Failed',
};

/** Today as a calendar date (YYYY-MM-DD) on this device, to compare with due dates. */
export function todayIso(now = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

/** A finding still open (or awaiting verification) after its due date. */
export const isPastDue = (f: { dueOn: string | null; state: FindingState }, today = todayIso()) =>
  f.dueOn !== null && f.state !== 'closed' && f.dueOn < today;

export const noticeHref = (id: string) => `/notices/${encodeURIComponent(id)}` as const;
