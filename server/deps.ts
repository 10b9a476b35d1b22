import type { Config } from '@/server/config';
import type { Db } from '@/server/db';
import type { Logger } from '@/server/logger';
import type { FakeSmtp } from '@/server/mail/fake-smtp';
import type { Mailer } from '@/server/mail/mailer';

/** What the app and its routers need from outside; tests pass their own. */
export type ApiDeps = {
  db: Db;
  config: Config;
  logger: Logger;
  /** Failed sign-ins allowed per IP and window; defaults to 10 per 15 minutes. */
  signInLimit?: { windowMs: number; max: number };
  /**
   * Failed sign-ins allowed per account e-mail (from any address) and window; defaults to `signInLimit`
   * when that is given (tests), else 10 per 15 minutes.
   */
  accountSignInLimit?: { windowMs: number; max: number };
  /** The clock for due dates and timestamps; tests pin it. Defaults to the system clock. */
  now?: () => Date;
  /**
   * Outgoing e-mail (server/mail, `startMailService`): the mailer, and the local mailbox when mail stays
   * on this machine (null when SMTP_URL points at a real server). Absent in tests that send no mail.
   */
  mail?: { mailer: Mailer; fake: FakeSmtp | null };
};

export const nowOf = (deps: Pick<ApiDeps, 'now'>): Date => deps.now?.() ?? new Date();
