/**
 * The logbook's list from its sources' lists: the text filter, newest first, then one page. Pure, so the
 * server's route, its exports and the tests run the same rule.
 */
import { logbookKinds, type LogbookEvent } from '@/features/logbook/schema';

const kindRank = new Map<string, number>(logbookKinds.map((k, i) => [k, i]));

/**
 * Newest first. Entries at the same instant (a decision and the notice it issued) keep a fixed order: by
 * kind as listed in `logbookKinds`, last kind first (so a notice stands above the decision that made it),
 * then by id.
 */
export function newestFirst(a: LogbookEvent, b: LogbookEvent): number {
  if (a.at !== b.at) return a.at < b.at ? 1 : -1;
  const ka = kindRank.get(a.kind) ?? 0;
  const kb = kindRank.get(b.kind) ?? 0;
  if (ka !== kb) return kb - ka;
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/** Lower case without accents, for matching what a person types. */
const fold = (s: string) => s.normalize('NFD').replace(/\p{M}/gu, '').toLowerCase();

/** Every word of `q` appears somewhere in the entry's title, detail lines, who or kind words. */
export function matchesText(e: LogbookEvent, q: string | undefined, kindLabel?: string): boolean {
  if (!q) return true;
  const hay = fold([e.title, ...e.detail, e.who ?? '', kindLabel ?? ''].join('\n'));
  return fold(q)
    .split(/\s+/)
    .filter(Boolean)
    .every((word) => hay.includes(word));
}

/** All the sources' entries that match `q`, newest first. */
export function mergeLogbook(lists: readonly (readonly LogbookEvent[])[], q?: string): LogbookEvent[] {
  return lists
    .flat()
    .filter((e) => matchesText(e, q))
    .sort(newestFirst);
}

/** Page `page` (from 1) of `pageSize` entries, and how many there are in all. */
export function pageOf<T>(
  items: readonly T[],
  page: number,
  pageSize: number,
): { items: T[]; total: number } {
  const start = (page - 1) * pageSize;
  return { items: items.slice(start, start + pageSize), total: items.length };
}
