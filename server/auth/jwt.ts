import { errors, jwtVerify, SignJWT } from 'jose';

import { roleSchema, type Role } from '@/features/session/schema';
import type { Config } from '@/server/config';
import { unauthorized } from '@/server/http/errors';

export const tokenIssuer = 'pivotwatch';
const algorithm = 'HS256';
/**
 * The issue time in milliseconds, beside JWT's whole-second `iat`: a sign-out followed by a new sign-in within
 * the same second must end the old token and keep the new one (compared with `users.tokens_valid_after`).
 */
const issuedAtMsClaim = 'iat_ms';

/** What a verified token says: whose it is, the role it was issued with, and when it was issued. */
export type VerifiedSession = { userId: string; role: Role; issuedAtMs: number };

type TokenConfig = Pick<Config, 'jwtSecret' | 'jwtTtlSeconds'>;

/** A signed session token for one user, and when it stops working (ISO 8601). */
export async function signSessionToken(
  user: { id: string; role: Role },
  config: TokenConfig,
  now: Date = new Date(),
): Promise<{ token: string; expiresAt: string }> {
  const issuedAt = Math.floor(now.getTime() / 1000);
  const expiresAt = issuedAt + config.jwtTtlSeconds;
  const token = await new SignJWT({ role: user.role, [issuedAtMsClaim]: now.getTime() })
    .setProtectedHeader({ alg: algorithm, typ: 'JWT' })
    .setSubject(user.id)
    .setIssuer(tokenIssuer)
    .setIssuedAt(issuedAt)
    .setExpirationTime(expiresAt)
    .sign(config.jwtSecret);
  return { token, expiresAt: new Date(expiresAt * 1000).toISOString() };
}

/**
 * Checks signature, issuer and expiry. The role in the token is only a hint: callers re-read the user, so a
 * role change or a disabled account takes effect on the next request rather than when the token runs out.
 */
export async function verifySessionToken(
  token: string,
  config: Pick<Config, 'jwtSecret'>,
  now: number = Date.now(),
): Promise<VerifiedSession> {
  const known = knownSessionToken(token, config, now);
  if (known) return known;
  try {
    const { payload } = await jwtVerify(token, config.jwtSecret, {
      issuer: tokenIssuer,
      algorithms: [algorithm],
      requiredClaims: ['sub', 'exp', 'iat'],
      currentDate: new Date(now),
    });
    const role = roleSchema.safeParse(payload.role);
    if (!payload.sub || !role.success) throw unauthorized('Your session is not valid. Sign in again.');
    const issuedAtMs = issuedAtMsOf(payload);
    remember(config.jwtSecret, token, {
      userId: payload.sub,
      role: role.data,
      issuedAtMs,
      expiresAtMs: (payload.exp ?? 0) * 1000,
    });
    return { userId: payload.sub, role: role.data, issuedAtMs };
  } catch (error) {
    if (error instanceof errors.JWTExpired) {
      throw unauthorized('Your session has expired. Sign in again.', 'session_expired');
    }
    throw unauthorized('Your session is not valid. Sign in again.');
  }
}

/**
 * A token already verified with this secret needs only its expiry checked again: the signature cannot have
 * changed. This takes the HMAC (and, answered without a promise, the microtasks) off every request of a busy
 * desk; the user row (and with it the session stamp, server/auth/require-auth.ts) is still re-read on every
 * request. Null when the token was not verified here yet: `verifySessionToken` then checks it.
 */
export function knownSessionToken(
  token: string,
  config: Pick<Config, 'jwtSecret'>,
  now: number = Date.now(),
): VerifiedSession | null {
  const known = verifiedTokens(config.jwtSecret).get(token);
  if (!known) return null;
  if (known.expiresAtMs > now)
    return { userId: known.userId, role: known.role, issuedAtMs: known.issuedAtMs };
  throw unauthorized('Your session has expired. Sign in again.', 'session_expired');
}

/**
 * Tokens signed before the millisecond claim existed carry only `iat`; their issue time is the start of that
 * second, so a stamp later in the same second still ends them. A claim that disagrees with `iat` by more than
 * a second (the claim must fall inside `iat`'s second) is not ours.
 */
function issuedAtMsOf(payload: { iat?: number; [claim: string]: unknown }): number {
  const seconds = (payload.iat ?? 0) * 1000;
  const ms = payload[issuedAtMsClaim];
  if (ms === undefined) return seconds;
  if (typeof ms !== 'number' || !Number.isFinite(ms) || ms < seconds || ms - seconds >= 1000) {
    throw unauthorized('Your session is not valid. Sign in again.');
  }
  return ms;
}

type VerifiedToken = VerifiedSession & { expiresAtMs: number };

/** At most this many verified tokens are remembered per secret; the oldest goes first. */
const VERIFIED_TOKEN_LIMIT = 1000;
const verifiedBySecret = new WeakMap<object, Map<string, VerifiedToken>>();

function verifiedTokens(secret: Config['jwtSecret']): Map<string, VerifiedToken> {
  let map = verifiedBySecret.get(secret);
  if (!map) {
    map = new Map();
    verifiedBySecret.set(secret, map);
  }
  return map;
}

function remember(secret: Config['jwtSecret'], token: string, verified: VerifiedToken): void {
  const map = verifiedTokens(secret);
  if (map.size >= VERIFIED_TOKEN_LIMIT) map.delete(map.keys().next().value as string);
  map.set(token, verified);
}
