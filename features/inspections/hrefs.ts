/** Links to the inspector's pages: Today and one inspection being filled in. tsc checks each against `app/`. */
import type { Href } from 'expo-router';

export const todayHref = '/today' as const satisfies Href;
export const scanHref = '/scan' as const satisfies Href;
export const inspectHref = (draftId: string) =>
  `/inspect/${encodeURIComponent(draftId)}` as const satisfies Href;
/** One inspection opened at its readings, with a pivot's card (joint index, 0-based) brought into view. */
export const inspectPivotHref = (draftId: string, joint: number) =>
  `${inspectHref(draftId)}?step=readings&pivot=${joint + 1}` as const satisfies Href;

/** The pivot an inspection link points at (`?pivot=n`, numbered from 1), as a joint index; else null. */
export function pivotOfParam(value: unknown): number | null {
  const text = Array.isArray(value) ? value[0] : value;
  if (typeof text !== 'string' || !/^[1-9]\d?$/.test(text)) return null;
  return Number(text) - 1;
}
