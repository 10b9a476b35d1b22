/** Links to the inspector's pages: Today and one inspection being filled in. tsc checks each against `app/`. */
import type { Href } from 'expo-router';

export const todayHref = '/today' as const satisfies Href;
export const inspectHref = (draftId: string) =>
  `/inspect/${encodeURIComponent(draftId)}` as const satisfies Href;
