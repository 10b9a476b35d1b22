/** Links to the people pages; tsc checks each against `app/` (typed routes), the values stay plain paths. */
import type { Href } from 'expo-router';

export const peopleHref = '/admin/people' as const satisfies Href;
export const personHref = (id: string) => `/admin/people/${encodeURIComponent(id)}` as const satisfies Href;
