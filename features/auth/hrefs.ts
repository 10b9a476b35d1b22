/**
 * Links to the sign-in and account pages, and each role's landing page. tsc checks each against `app/`
 * (typed routes); the values stay plain path strings.
 */
import type { Href } from 'expo-router';

import type { Role } from '@/features/session/schema';

export const accountHref = '/account' as const satisfies Href;

/** The sign-in page, coming back to `next` (a path of this site) once signed in. */
export const signInHref = (next?: string | null) =>
  (next ? (`/sign-in?next=${encodeURIComponent(next)}` as const) : '/sign-in') satisfies Href;

/** Each role's landing page. */
export const roleHome = {
  inspector: '/today',
  supervisor: '/review',
  operator: '/my-rides',
  admin: '/admin',
} as const satisfies Record<Role, Href>;
