import { eq } from 'drizzle-orm';
import { SignJWT } from 'jose';
import request from 'supertest';

import { users } from '@/db/server/schema';
import { meResponseSchema, signInResponseSchema } from '@/features/auth/schema';
import { signSessionToken, tokenIssuer } from '@/server/auth/jwt';
import { demoPassword, demoUsers } from '@/server/seed/demo';

import { expectApiError, makeTestServer, signInAs, userIdOf, type TestServer } from './helpers';

let server: TestServer;
beforeAll(async () => {
  server = await makeTestServer();
});
afterAll(() => server.close());

describe('POST /api/auth/sign-in', () => {
  test.each(demoUsers.map((u) => [u.role, u] as const))('signs in the demo %s', async (_role, demo) => {
    const res = await request(server.app)
      .post('/api/auth/sign-in')
      .send({ email: demo.email, password: demoPassword });
    expect(res.status).toBe(200);
    const body = signInResponseSchema.parse(res.body);
    expect(body.user).toMatchObject({
      email: demo.email,
      name: demo.name,
      role: demo.role,
      companyName: demo.company,
    });
    expect(body.user.companyId === null).toBe(demo.company === null);
    expect(res.body.user).not.toHaveProperty('passwordHash');
    // The token lasts the configured 12 hours.
    const hoursLeft = (Date.parse(body.expiresAt) - Date.now()) / 3_600_000;
    expect(hoursLeft).toBeGreaterThan(11.9);
    expect(hoursLeft).toBeLessThanOrEqual(12);
  });

  test('the e-mail is matched case-insensitively and trimmed', async () => {
    const res = await request(server.app)
      .post('/api/auth/sign-in')
      .send({ email: '  Supervisor@PivotWatch.TEST ', password: demoPassword });
    expect(res.status).toBe(200);
    expect(res.body.user.role).toBe('supervisor');
  });

  test('wrong password and unknown e-mail → the same 401', async () => {
    const wrongPassword = await request(server.app)
      .post('/api/auth/sign-in')
      .send({ email: 'admin@pivotwatch.test', password: 'not-the-password' });
    const unknownEmail = await request(server.app)
      .post('/api/auth/sign-in')
      .send({ email: 'nobody@pivotwatch.test', password: 'not-the-password' });
    const a = expectApiError(wrongPassword, 401, 'invalid_credentials');
    const b = expectApiError(unknownEmail, 401, 'invalid_credentials');
    expect(a).toEqual(b);
    expect(wrongPassword.body.token).toBeUndefined();
  });

  test('a disabled user cannot sign in, and their live token stops working', async () => {
    const email = 'inspector@pivotwatch.test';
    const token = await signInAs(server.app, email);
    server.db.update(users).set({ disabledAt: new Date().toISOString() }).where(eq(users.email, email)).run();
    try {
      const signIn = await request(server.app)
        .post('/api/auth/sign-in')
        .send({ email, password: demoPassword });
      expectApiError(signIn, 401, 'account_disabled');
      const me = await request(server.app).get('/api/me').set('Authorization', `Bearer ${token}`);
      expectApiError(me, 401, 'unauthorized');
    } finally {
      server.db.update(users).set({ disabledAt: null }).where(eq(users.email, email)).run();
    }
  });
});

describe('GET /api/me', () => {
  test('with a token → the user, re-read from the database', async () => {
    const token = await signInAs(server.app, 'operator@pivotwatch.test');
    const res = await request(server.app).get('/api/me').set('Authorization', `Bearer ${token}`);
    expect(res.status).toBe(200);
    const { user } = meResponseSchema.parse(res.body);
    expect(user).toMatchObject({
      email: 'operator@pivotwatch.test',
      role: 'operator',
      companyName: 'Tamsworth Pier Leisure',
    });

    // A rename shows on the next call without a new token.
    server.db.update(users).set({ name: 'Priya C.' }).where(eq(users.id, user.id)).run();
    const again = await request(server.app).get('/api/me').set('Authorization', `Bearer ${token}`);
    expect(again.body.user.name).toBe('Priya C.');
    server.db.update(users).set({ name: 'Priya Castellan' }).where(eq(users.id, user.id)).run();
  });

  test('without a token → 401', async () => {
    expectApiError(await request(server.app).get('/api/me'), 401, 'unauthorized');
  });

  test.each([
    ['garbage', 'Bearer not-a-jwt'],
    ['a non-Bearer scheme', 'Basic YWRtaW46cGl2b3R3YXRjaA=='],
    ['an empty Bearer', 'Bearer '],
  ])('with %s → 401', async (_label, header) => {
    expectApiError(
      await request(server.app).get('/api/me').set('Authorization', header),
      401,
      'unauthorized',
    );
  });

  test('with an expired token → 401 session_expired', async () => {
    const userId = userIdOf(server.db, 'admin@pivotwatch.test');
    const anHourAgo = Math.floor(Date.now() / 1000) - 3600;
    const expired = await new SignJWT({ role: 'admin' })
      .setProtectedHeader({ alg: 'HS256' })
      .setSubject(userId)
      .setIssuer(tokenIssuer)
      .setIssuedAt(anHourAgo - 60)
      .setExpirationTime(anHourAgo)
      .sign(server.config.jwtSecret);
    const res = await request(server.app).get('/api/me').set('Authorization', `Bearer ${expired}`);
    const error = expectApiError(res, 401, 'session_expired');
    expect(error.message).toMatch(/expired/);
  });

  test('a token signed with another secret, or by another issuer, → 401', async () => {
    const userId = userIdOf(server.db, 'admin@pivotwatch.test');
    const otherSecret = await signSessionToken(
      { id: userId, role: 'admin' },
      {
        jwtSecret: new TextEncoder().encode('another-secret-that-is-long-enough-to-use'),
        jwtTtlSeconds: 600,
      },
    );
    const otherIssuer = await new SignJWT({ role: 'admin' })
      .setProtectedHeader({ alg: 'HS256' })
      .setSubject(userId)
      .setIssuer('someone-else')
      .setIssuedAt()
      .setExpirationTime('10m')
      .sign(server.config.jwtSecret);
    for (const token of [otherSecret.token, otherIssuer]) {
      const res = await request(server.app).get('/api/me').set('Authorization', `Bearer ${token}`);
      expectApiError(res, 401, 'unauthorized');
    }
  });

  test('a valid token for a deleted user → 401', async () => {
    const ghost = await signSessionToken({ id: 'no-such-user', role: 'admin' }, server.config);
    const res = await request(server.app).get('/api/me').set('Authorization', `Bearer ${ghost.token}`);
    expectApiError(res, 401, 'unauthorized');
  });
});

describe('sign-in rate limit (default: 10 failures per 15 minutes per IP)', () => {
  let limited: TestServer;
  beforeAll(async () => {
    limited = await makeTestServer({ signInLimit: 'app-default' });
  });
  afterAll(() => limited.close());

  test('the 11th failed attempt → 429 JSON with Retry-After; earlier ones → 401', async () => {
    const attempt = () =>
      request(limited.app)
        .post('/api/auth/sign-in')
        .send({ email: 'admin@pivotwatch.test', password: 'guess' });
    for (let i = 0; i < 10; i += 1) {
      expectApiError(await attempt(), 401, 'invalid_credentials');
    }
    const blocked = await attempt();
    expectApiError(blocked, 429, 'too_many_attempts');
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);

    // Even the right password waits out the window: the limiter runs before the password is checked.
    const right = await request(limited.app)
      .post('/api/auth/sign-in')
      .send({ email: 'admin@pivotwatch.test', password: demoPassword });
    expectApiError(right, 429, 'too_many_attempts');
  });
});

test('successful sign-ins do not count towards the limit', async () => {
  const strict = await makeTestServer({ signInLimit: { windowMs: 60_000, max: 2 } });
  try {
    for (let i = 0; i < 5; i += 1) {
      const res = await request(strict.app)
        .post('/api/auth/sign-in')
        .send({ email: 'supervisor@pivotwatch.test', password: demoPassword });
      expect(res.status).toBe(200);
    }
    const fail = () =>
      request(strict.app)
        .post('/api/auth/sign-in')
        .send({ email: 'supervisor@pivotwatch.test', password: 'x' });
    expect((await fail()).status).toBe(401);
    expect((await fail()).status).toBe(401);
    expect((await fail()).status).toBe(429);
  } finally {
    strict.close();
  }
  // Seeding and eight password checks (bcrypt, deliberately slow) outlast 5 s on a busy two-core machine.
}, 30_000);
