/**
 * Revocable sessions: a per-person stamp (`users.tokens_valid_after`) refuses every token issued before it,
 * on every request, and `POST /api/auth/sign-out` moves it. Tokens are JWTs (RFC 7519): `iat` is in whole
 * seconds (§4.1.6), so the issue time is also carried in milliseconds in a claim of our own beside it.
 */
import { and, eq } from 'drizzle-orm';
import { decodeJwt, SignJWT } from 'jose';
import request from 'supertest';

import { auditLog } from '@/db/server/schema';
import { signSessionToken, tokenIssuer, verifySessionToken } from '@/server/auth/jwt';
import { endSessions } from '@/server/auth/sessions';

import { expectApiError, makeTestServer, signInAs, userIdOf, type TestServer } from './helpers';

let server: TestServer;
beforeAll(async () => {
  server = await makeTestServer();
});
afterAll(() => server.close());

const me = (token: string) => request(server.app).get('/api/me').set('Authorization', `Bearer ${token}`);
const signOut = (token: string) =>
  request(server.app).post('/api/auth/sign-out').set('Authorization', `Bearer ${token}`);

describe('POST /api/auth/sign-out', () => {
  test('ends that token at once (even though it was verified and remembered), and every other of the person', async () => {
    const email = 'inspector@pivotwatch.test';
    const phone = await signInAs(server.app, email);
    const laptop = await signInAs(server.app, email);
    const someoneElse = await signInAs(server.app, 'supervisor@pivotwatch.test');
    // Both answered 200 once, so both sit in the verified-token cache.
    expect((await me(phone)).status).toBe(200);
    expect((await me(laptop)).status).toBe(200);

    const res = await signOut(phone);
    expect(res.status).toBe(204);
    expect(res.text).toBe('');

    for (const token of [phone, laptop]) {
      const error = expectApiError(await me(token), 401, 'session_ended');
      expect(error.message).toMatch(/Sign in again/);
    }
    // Another person's session is untouched.
    expect((await me(someoneElse)).status).toBe(200);
    // Signing out twice with the ended token is refused like any other use of it.
    expectApiError(await signOut(phone), 401, 'session_ended');
  });

  test('a sign-in right after a sign-out (same second) gives a token that works', async () => {
    const email = 'operator@pivotwatch.test';
    const before = await signInAs(server.app, email);
    expect((await signOut(before)).status).toBe(204);
    const after = await signInAs(server.app, email);
    expect((await me(after)).status).toBe(200);
    expectApiError(await me(before), 401, 'session_ended');
  });

  test('is written to the audit log as the person’s own sign-out', async () => {
    const email = 'admin@pivotwatch.test';
    const userId = userIdOf(server.db, email);
    const token = await signInAs(server.app, email);
    expect((await signOut(token)).status).toBe(204);
    const entries = server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.entity, 'user'), eq(auditLog.action, 'sign_out'), eq(auditLog.entityId, userId)))
      .all();
    expect(entries).toHaveLength(1);
    expect(entries[0].userId).toBe(userId);
    expect(entries[0].summary).toMatch(/signed out/);
  });

  test('needs a token: without one → 401 and nothing written', async () => {
    const count = () => server.db.select().from(auditLog).where(eq(auditLog.action, 'sign_out')).all().length;
    const n = count();
    expectApiError(await request(server.app).post('/api/auth/sign-out'), 401, 'unauthorized');
    expect(count()).toBe(n);
  });
});

describe('the session stamp (users.tokens_valid_after)', () => {
  const email = 'supervisor@pivotwatch.test';

  test('a token issued before the stamp → 401 session_ended; one issued at or after it → 200', async () => {
    const id = userIdOf(server.db, email);
    const stamp = new Date(Date.now() - 60_000);
    endSessions(server.db, id, stamp);
    const sign = (offsetMs: number) =>
      signSessionToken({ id, role: 'supervisor' }, server.config, new Date(stamp.getTime() + offsetMs));
    expectApiError(await me((await sign(-1)).token), 401, 'session_ended');
    expectApiError(await me((await sign(-3_600_000)).token), 401, 'session_ended');
    expect((await me((await sign(0)).token)).status).toBe(200);
    expect((await me((await sign(1)).token)).status).toBe(200);
  });

  test('the token carries its issue time to the millisecond, inside the second of `iat`', async () => {
    const at = new Date('2026-12-03T18:20:45.678Z');
    const { token } = await signSessionToken({ id: 'u1', role: 'inspector' }, { ...server.config }, at);
    const claims = decodeJwt(token);
    expect(claims.iat).toBe(1796322045); // 2026-12-03T18:20:45Z in Unix seconds (date -d … +%s)
    expect(claims.iat_ms).toBe(at.getTime());
    const verified = await verifySessionToken(token, server.config, at.getTime() + 1000);
    expect(verified).toEqual({ userId: 'u1', role: 'inspector', issuedAtMs: at.getTime() });
  });

  test('an older token without the millisecond claim counts from the start of its second', async () => {
    const id = userIdOf(server.db, email);
    const second = Math.floor(Date.now() / 1000) - 30;
    const plain = await new SignJWT({ role: 'supervisor' })
      .setProtectedHeader({ alg: 'HS256' })
      .setSubject(id)
      .setIssuer(tokenIssuer)
      .setIssuedAt(second)
      .setExpirationTime(second + 3600)
      .sign(server.config.jwtSecret);
    endSessions(server.db, id, new Date(second * 1000 - 1));
    expect((await me(plain)).status).toBe(200);
    // A stamp half-way through the token's second ends it.
    endSessions(server.db, id, new Date(second * 1000 + 500));
    expectApiError(await me(plain), 401, 'session_ended');
  });

  test('a millisecond claim outside the second of `iat` is refused as not ours', async () => {
    const id = userIdOf(server.db, email);
    const second = Math.floor(Date.now() / 1000);
    const forged = await new SignJWT({ role: 'supervisor', iat_ms: (second + 3600) * 1000 })
      .setProtectedHeader({ alg: 'HS256' })
      .setSubject(id)
      .setIssuer(tokenIssuer)
      .setIssuedAt(second)
      .setExpirationTime(second + 3600)
      .sign(server.config.jwtSecret);
    expectApiError(await me(forged), 401, 'unauthorized');
  });

  test('moving the stamp ends a token that was already verified and remembered', async () => {
    const token = await signInAs(server.app, email);
    expect((await me(token)).status).toBe(200);
    endSessions(server.db, userIdOf(server.db, email));
    expectApiError(await me(token), 401, 'session_ended');
  });
});
