/** Links to the operator's daily checks. `satisfies Href` has tsc check it against `app/` (typed routes). */
import type { Href } from 'expo-router';

export const dailyChecksHref = '/daily' as const satisfies Href;
