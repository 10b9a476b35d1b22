import { errors, jwtVerify, SignJWT } from 'jose';

import { roleSchema, type Role } from '@/features/auth/schema';
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
): Promise<{ userId: string; role: Role }> {
  try {
    const { payload } = await jwtVerify(token, config.jwtSecret, {
      issuer: tokenIssuer,
      algorithms: [algorithm],
      requiredClaims: ['sub', 'exp', 'iat'],
    });
    const role = roleSchema.safeParse(payload.role);
    if (!payload.sub || !role.success) throw unauthorized('Your session is not valid. Sign in again.');
    return { userId: payload.sub, role: role.data };
  } catch (error) {
    if (error instanceof errors.JWTExpired) {
      throw unauthorized('Your session has expired. Sign in again.', 'session_expired');
    }
    throw unauthorized('Your session is not valid. Sign in again.');
  }
}
