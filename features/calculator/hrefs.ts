/** The link to the load calculator. tsc checks it against `app/` (typed routes). */
import type { Href } from 'expo-router';

export const calculatorHref = '/loads' as const satisfies Href;
