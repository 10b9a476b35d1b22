/** A bulletin's deadline and its record on a ride, in words (pure: the screens and tests share them). */
import type { BulletinAction } from '@/features/bulletins/schema';
import { formatDate } from '@/lib/dates';

export function deadlineWords(b: { deadlineOn: string | null; beforeNextOperation: boolean }): string {
  if (b.beforeNextOperation) return 'Before the ride next runs';
  return b.deadlineOn ? `By ${formatDate(b.deadlineOn)}` : 'No deadline set by the maker';
}

/** "Done 4 May 2026 by Tomas Reyne at an inspection: …" */
export function actionWords(a: BulletinAction): string {
  const how = a.inspectionId ? ' at an inspection' : '';
  const what = a.outcome === 'done' ? 'Done' : 'Found not done';
  return `${what} ${formatDate(a.on)} by ${a.byName}${how}${a.note ? `: ${a.note}` : ''}`;
}
