/**
 * Set-password links (an invitation or an administrator's reset) and a person's own password change. A
 * link's token is 32 random bytes; only its SHA-256 is stored, it works once, and it runs out (invitations
 * after 7 days, resets after 24 hours). Issuing a link for someone closes any older open one of theirs.
 */
import { createHash, randomBytes } from 'node:crypto';

import { and, eq, gt, isNull } from 'drizzle-orm';

import { passwordLinks } from '@/db/server/accounts';
import { users } from '@/db/server/schema';
import type { SignInResponse } from '@/features/auth/schema';
import {
  passwordProblem,
  type PasswordChangeBody,
  type PasswordLinkInfo,
  type PasswordLinkPurpose,
} from '@/features/auth/password-schema';
import type { SessionUser } from '@/features/session/schema';
import { roleVocabulary } from '@/lib/vocabulary';
import { queueAccountMail, type AccountMailContent } from '@/server/auth/account-mail';
import { signSessionToken } from '@/server/auth/jwt';
import { hashPassword, verifyPassword } from '@/server/auth/password';
import { findSessionUser } from '@/server/auth/service';
import { recordUserAudit } from '@/server/auth/user-audit';
import { endSessions } from '@/server/auth/sessions';
import type { Config } from '@/server/config';
import type { Db } from '@/server/db';
import { HttpError, notFound } from '@/server/http/errors';

const hourMs = 3_600_000;
export const linkLifetimeMs: Record<PasswordLinkPurpose, number> = {
  invite: 7 * 24 * hourMs,
  reset: 24 * hourMs,
};

export const tokenHash = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

/** The page a link opens; the token travels in the query and never in a path the server logs as a route. */
export const setPasswordUrl = (appUrl: string, token: string) =>
  `${appUrl}/set-password?token=${encodeURIComponent(token)}`;

type Tx = Pick<Db, 'insert' | 'update'>;
type LinkFor = {
  user: Pick<SessionUser, 'id' | 'email' | 'name' | 'role'>;
  purpose: PasswordLinkPurpose;
  sender: Pick<SessionUser, 'id' | 'name'>;
  now: Date;
  appUrl: string;
};

/** Creates a link and queues the e-mail carrying it, inside the caller's transaction; returns the token. */
export function issuePasswordLink(tx: Tx, link: LinkFor): string {
  const token = randomBytes(32).toString('base64url');
  const at = link.now.toISOString();
  // An older open link stops working: only the newest e-mail's link sets a password.
  tx.update(passwordLinks)
    .set({ expiresAt: at })
    .where(
      and(
        eq(passwordLinks.userId, link.user.id),
        isNull(passwordLinks.usedAt),
        gt(passwordLinks.expiresAt, at),
      ),
    )
    .run();
  const expiresAt = new Date(link.now.getTime() + linkLifetimeMs[link.purpose]);
  tx.insert(passwordLinks)
    .values({
      userId: link.user.id,
      purpose: link.purpose,
      tokenSha256: tokenHash(token),
      expiresAt: expiresAt.toISOString(),
      createdBy: link.sender.id,
      createdAt: at,
    })
    .run();
  queueAccountMail(tx, {
    userId: link.user.id,
    recipient: link.user.email,
    content: linkMail(link, setPasswordUrl(link.appUrl, token)),
    now: link.now,
  });
  return token;
}

const escapeHtml = (text: string) =>
  text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** The e-mail: plain words, the link, how long it lasts, and what to do when it was not expected. */
export function linkMail(link: LinkFor, url: string): AccountMailContent {
  const invite = link.purpose === 'invite';
  const lasts = invite ? '7 days' : '24 hours';
  const lines = invite
    ? [
        `Hello ${link.user.name},`,
        '',
        `${link.sender.name} has made you a Pivotwatch account as ${roleVocabulary[link.user.role].label.toLowerCase()}.`,
        `Your sign-in name is ${link.user.email}. Choose your password here (the link works once, for ${lasts}):`,
      ]
    : [
        `Hello ${link.user.name},`,
        '',
        `${link.sender.name} has reset your Pivotwatch password. Your old password no longer works, and every device you were signed in on has been signed out.`,
        `Choose a new password here (the link works once, for ${lasts}):`,
      ];
  const after = [
    '',
    'If you did not expect this message, ignore it and tell your administrator; nothing changes until the link is used.',
  ];
  const text = [...lines, url, ...after].join('\n');
  const html = [
    '<!doctype html><html><body style="font-family: sans-serif; line-height: 1.4">',
    ...lines.filter(Boolean).map((l) => `<p>${escapeHtml(l)}</p>`),
    `<p><a href="${escapeHtml(url)}">${invite ? 'Choose your password' : 'Choose a new password'}</a></p>`,
    `<p>${escapeHtml(after[1])}</p>`,
    '</body></html>',
  ].join('\n');
  return { subject: invite ? 'Your Pivotwatch account' : 'Your Pivotwatch password was reset', text, html };
}

function findLink(db: Pick<Db, 'select'>, token: string) {
  if (token.length < 16 || token.length > 200) return undefined;
  return db
    .select({
      id: passwordLinks.id,
      purpose: passwordLinks.purpose,
      expiresAt: passwordLinks.expiresAt,
      usedAt: passwordLinks.usedAt,
      userId: users.id,
      name: users.name,
      email: users.email,
      disabledAt: users.disabledAt,
    })
    .from(passwordLinks)
    .innerJoin(users, eq(users.id, passwordLinks.userId))
    .where(eq(passwordLinks.tokenSha256, tokenHash(token)))
    .get();
}

const unknownLink = () =>
  notFound(
    'This link is not known. Check that the whole link was copied, or ask your administrator for a new one.',
  );

/** Who the link is for and whether it still works; an unknown token is a 404. */
export function readPasswordLink(db: Db, token: string, now: Date): PasswordLinkInfo {
  const link = findLink(db, token);
  if (!link) throw unknownLink();
  const state = link.usedAt !== null ? 'used' : link.expiresAt <= now.toISOString() ? 'expired' : 'valid';
  return { purpose: link.purpose, name: link.name, email: link.email, expiresAt: link.expiresAt, state };
}

const linkGone = (state: 'used' | 'expired') =>
  new HttpError(
    410,
    state === 'used' ? 'link_used' : 'link_expired',
    state === 'used'
      ? 'This link has already been used. Sign in with the password you chose, or ask your administrator for a new link.'
      : 'This link has run out. Ask your administrator to send a new one.',
  );

const passwordIssue = (path: string, message: string) =>
  new HttpError(400, 'validation_failed', message, [{ path, message }]);

/** Sets the password from a link (once), ends any other session, and signs the person in. */
export async function usePasswordLink(
  db: Db,
  config: Config,
  token: string,
  password: string,
  now: Date,
): Promise<SignInResponse> {
  const link = findLink(db, token);
  if (!link) throw unknownLink();
  if (link.usedAt !== null) throw linkGone('used');
  if (link.expiresAt <= now.toISOString()) throw linkGone('expired');
  if (link.disabledAt !== null) {
    throw new HttpError(
      403,
      'account_disabled',
      'This account is disabled. Ask an administrator to enable it.',
    );
  }
  const problem = passwordProblem(password, link.email);
  if (problem) throw passwordIssue('password', problem);
  const passwordHash = await hashPassword(password);
  db.transaction((tx) => {
    // The used mark is the claim: of two requests racing with the same link, only one finds it unused.
    const claimed = tx
      .update(passwordLinks)
      .set({ usedAt: now.toISOString() })
      .where(and(eq(passwordLinks.id, link.id), isNull(passwordLinks.usedAt)))
      .run();
    if (claimed.changes !== 1) throw linkGone('used');
    tx.update(users).set({ passwordHash }).where(eq(users.id, link.userId)).run();
    endSessions(tx, link.userId, now);
    recordUserAudit(tx, {
      userId: link.userId,
      entityId: link.userId,
      action: 'password_set',
      summary: `${link.name} chose a password from ${link.purpose === 'invite' ? 'the invitation' : 'a reset link'}`,
    });
  });
  return signedIn(db, config, link.userId);
}

async function signedIn(db: Db, config: Config, userId: string): Promise<SignInResponse> {
  const user = findSessionUser(db, userId);
  if (!user) throw new HttpError(403, 'account_disabled', 'This account is not active.');
  const { token, expiresAt } = await signSessionToken(user, config);
  return { token, expiresAt, user };
}

/**
 * A person's own change: the current password must be right, every other session ends, and this device
 * gets a fresh token so it stays signed in.
 */
export async function changeOwnPassword(
  db: Db,
  config: Config,
  user: SessionUser,
  body: PasswordChangeBody,
  now: Date,
): Promise<SignInResponse> {
  const row = db.select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, user.id)).get();
  if (!row || !(await verifyPassword(body.currentPassword, row.passwordHash))) {
    throw passwordIssue('currentPassword', 'The current password is not right');
  }
  const problem = passwordProblem(body.newPassword, user.email);
  if (problem) throw passwordIssue('newPassword', problem);
  const passwordHash = await hashPassword(body.newPassword);
  db.transaction((tx) => {
    tx.update(users).set({ passwordHash }).where(eq(users.id, user.id)).run();
    endSessions(tx, user.id, now);
    recordUserAudit(tx, {
      userId: user.id,
      entityId: user.id,
      action: 'password_change',
      summary: `${user.name} changed their password (other devices signed out)`,
    });
  });
  return signedIn(db, config, user.id);
}
