import type { UnsentWork } from '@/features/device-db';

/** The lines of the sign-out warning, one per kind of unsent work, in words; empty when nothing waits. */
export function unsentWorkLines(work: UnsentWork): string[] {
  const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  const lines: string[] = [];
  if (work.drafts > 0)
    lines.push(`${count(work.drafts, 'inspection', 'inspections')} being recorded (not yet submitted)`);
  if (work.queued > 0)
    lines.push(`${count(work.queued, 'submitted inspection', 'submitted inspections')} not yet sent`);
  if (work.rejected > 0)
    lines.push(
      `${count(work.rejected, 'inspection', 'inspections')} the server refused, waiting for you to act`,
    );
  if (work.photos > 0) lines.push(`${count(work.photos, 'photo', 'photos')} not yet uploaded`);
  return lines;
}

/** Whether "send now" could get anything off the phone (drafts go only when their author submits them). */
export const sendable = (work: UnsentWork) => work.queued > 0 || work.photos > 0;
