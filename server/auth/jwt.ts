import { errors, jwtVerify, SignJWT } from 'jose';

import { roleSchema, type Role } from '@/features/session/schema';
import type { Config } from '@/server/config';
import { unauthorized } from '@/server/http/errors';

export const tokenIssuer = 'pivotwatch';
const algorithm = 'HS256';

type TokenConfig = Pick<Config, 'jwtSecret' | 'jwtTtlSeconds'>;

/** A signed session token for one user, and when it stops working (ISO 8601). */
export async function signSessionToken(
  user: { id: string; role: Role },
  config: TokenConfig,
  now: Date = new Date(),
): Promise<{ token: string; expiresAt: string }> {
  const issuedAt = Math.floor(now.getTime() / 1000);
  const expiresAt = issuedAt + config.jwtTtlSeconds;
  const token = await new SignJWT({ role: user.role })
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
): Promise<{ userId: string; role: Role }> {
  // A token already verified with this secret needs only its expiry checked again: the signature cannot
  // have changed. This takes the HMAC off every request of a busy desk; the user row is still re-read.
  const known = verifiedTokens(config.jwtSecret).get(token);
  if (known) {
    if (known.expiresAtMs > now) return { userId: known.userId, role: known.role };
    throw unauthorized('Your session has expired. Sign in again.', 'session_expired');
  }
  try {
    const { payload } = await jwtVerify(token, config.jwtSecret, {
      issuer: tokenIssuer,
      algorithms: [algorithm],
      requiredClaims: ['sub', 'exp', 'iat'],
    });
    const role = roleSchema.safeParse(payload.role);
    if (!payload.sub || !role.success) throw unauthorized('Your session is not valid. Sign in again.');
    remember(config.jwtSecret, token, {
      userId: payload.sub,
      role: role.data,
      expiresAtMs: (payload.exp ?? 0) * 1000,
    });
    return { userId: payload.sub, role: role.data };
  } catch (error) {
    if (error instanceof errors.JWTExpired) {
      throw unauthorized('Your session has expired. Sign in again.', 'session_expired');
    }
    throw unauthorized('Your session is not valid. Sign in again.');
  }
}

type VerifiedToken = { userId: string; role: Role; expiresAtMs: number };

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
