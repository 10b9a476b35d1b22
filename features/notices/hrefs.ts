/**
 * Links to the notice pages. A notice's own page is also written by the server into e-mails, so its path
 * comes from `lib/paths.ts`; `satisfies Href` has tsc check each against `app/` (typed routes).
 */
import type { Href } from 'expo-router';

import { noticePath } from '@/lib/paths';

export const noticesHref = '/notices' as const satisfies Href;
export const noticeHref = (id: string) => noticePath(id) satisfies Href;
/** The e-mail outbox (an admin page, drawn by the notices feature). */
export const outboxHref = '/admin/outbox' as const satisfies Href;
