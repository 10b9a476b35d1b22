/**
 * Sign-in limits: one bucket per client address and one per account e-mail, both counting failures only,
 * and every failed sign-in in the audit log. X-Forwarded-For (RFC 7239 describes its standard successor,
 * Forwarded) is believed only from proxies TRUST_PROXY names; addresses below are from the documentation
 * ranges of RFC 5737 (192.0.2.0/24, 198.51.100.0/24, 203.0.113.0/24).
 */
import { and, eq } from 'drizzle-orm';
import request from 'supertest';

import { auditLog, users } from '@/db/server/schema';
import { demoPassword } from '@/server/seed/demo';

import { expectApiError, makeTestServer, userIdOf, type TestServer } from './helpers';

jest.setTimeout(60_000);

const generous = { windowMs: 60_000, max: 10_000 };
const servers: TestServer[] = [];
afterAll(() => servers.forEach((s) => s.close()));
async function server(opts: Parameters<typeof makeTestServer>[0]) {
  const s = await makeTestServer(opts);
  servers.push(s);
  return s;
}

const signIn = (s: TestServer, email: string, password: string, forwardedFor?: string) => {
  const req = request(s.app).post('/api/auth/sign-in');
  if (forwardedFor) req.set('X-Forwarded-For', forwardedFor);
  return req.send({ email, password });
};
const failures = (s: TestServer) =>
  s.db.select().from(auditLog).where(eq(auditLog.action, 'sign_in_failed')).all();

describe('per account, behind a proxy (TRUST_PROXY=1)', () => {
  const email = 'supervisor@pivotwatch.test';

  test('ten wrong passwords from ten addresses, and the eleventh try is refused from any address', async () => {
    const s = await server({ env: { TRUST_PROXY: '1' }, signInLimit: 'app-default' });
    for (let i = 1; i <= 10; i += 1) {
      expectApiError(await signIn(s, email, `guess-${i}`, `203.0.113.${i}`), 401, 'invalid_credentials');
    }
    // A new address: the address limit (10 per address) has seen nothing from it; the account limit has.
    const blocked = await signIn(s, email, 'guess-11', '198.51.100.7');
    const error = expectApiError(blocked, 429, 'too_many_attempts');
    expect(error.message).toMatch(/for this e-mail address.*Wait up to 15 minutes/);
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    // The right password waits too: the limit runs before the password is checked.
    expectApiError(await signIn(s, email, demoPassword, '198.51.100.8'), 429, 'too_many_attempts');
    // Case and spaces do not make a new account key.
    expectApiError(
      await signIn(s, '  SUPERVISOR@pivotwatch.TEST ', 'x', '198.51.100.9'),
      429,
      'too_many_attempts',
    );
    // Other people, from an address used above, sign in as usual.
    expect((await signIn(s, 'inspector@pivotwatch.test', demoPassword, '203.0.113.1')).status).toBe(200);
    // Each failure was audited with the client's own address (the proxy passed it on); refusals were not.
    const rows = failures(s);
    expect(rows).toHaveLength(10);
    expect(rows.map((r) => (r.after as { address: string }).address).sort()).toEqual(
      Array.from({ length: 10 }, (_, i) => `203.0.113.${i + 1}`).sort(),
    );
  });

  test('an unknown e-mail is limited the same way, so the limit reveals nothing', async () => {
    const s = await server({ env: { TRUST_PROXY: '1' }, signInLimit: 'app-default' });
    const ghost = 'nobody@pivotwatch.test';
    for (let i = 1; i <= 10; i += 1) {
      expectApiError(await signIn(s, ghost, 'guess', `192.0.2.${i}`), 401, 'invalid_credentials');
    }
    const known = await signIn(s, email, 'guess', '192.0.2.200');
    const unknown = await signIn(s, ghost, 'guess', '192.0.2.201');
    expectApiError(known, 401, 'invalid_credentials');
    expectApiError(unknown, 429, 'too_many_attempts');
  });
});

describe('per address', () => {
  test('without TRUST_PROXY a forged X-Forwarded-For changes nothing: one address, one bucket', async () => {
    const s = await server({ signInLimit: { windowMs: 60_000, max: 3 }, accountSignInLimit: generous });
    const emails = ['a@pivotwatch.test', 'b@pivotwatch.test', 'c@pivotwatch.test', 'd@pivotwatch.test'];
    for (const [i, email] of emails.slice(0, 3).entries()) {
      expectApiError(await signIn(s, email, 'x', `203.0.113.${i + 1}`), 401, 'invalid_credentials');
    }
    const blocked = await signIn(s, emails[3], 'x', '203.0.113.99');
    const error = expectApiError(blocked, 429, 'too_many_attempts');
    expect(error.message).toMatch(/Too many failed sign-in attempts\. Wait up to 1 minutes?/);
    // The audit log holds the connection's own address, not the forged one.
    for (const row of failures(s)) {
      const { address } = row.after as { address: string };
      expect(address).toMatch(/127\.0\.0\.1$/);
    }
  });

  test('with TRUST_PROXY=1 each client behind the proxy has its own bucket', async () => {
    const s = await server({
      env: { TRUST_PROXY: '1' },
      signInLimit: { windowMs: 60_000, max: 2 },
      accountSignInLimit: generous,
    });
    const tryFrom = (ip: string) => signIn(s, 'x@pivotwatch.test', 'x', ip);
    expect((await tryFrom('203.0.113.1')).status).toBe(401);
    expect((await tryFrom('203.0.113.1')).status).toBe(401);
    expect((await tryFrom('203.0.113.1')).status).toBe(429);
    // Someone else on the same site network is not locked out by the first person's typos.
    expect((await tryFrom('203.0.113.2')).status).toBe(401);
  });
});

describe('the audit log of failed sign-ins', () => {
  let s: TestServer;
  beforeAll(async () => {
    s = await server({});
  });

  test('a wrong password: the account, the address and the reason; no actor', async () => {
    const email = 'operator@pivotwatch.test';
    const id = userIdOf(s.db, email);
    expectApiError(await signIn(s, email, 'not-it'), 401, 'invalid_credentials');
    const [row] = s.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, 'sign_in_failed'), eq(auditLog.entityId, id)))
      .all();
    expect(row).toMatchObject({ entity: 'user', userId: null });
    expect(row.after).toMatchObject({ email, reason: 'wrong_password' });
    expect((row.after as { address: string }).address).toMatch(/127\.0\.0\.1$/);
    expect(row.summary).toMatch(/^Failed sign-in for operator@pivotwatch\.test from .*: wrong password$/);
  });

  test('an unknown e-mail is recorded under the e-mail; the answer is the same as for a wrong password', async () => {
    const unknown = await signIn(s, 'Stranger@Example.TEST', 'whatever');
    const wrong = await signIn(s, 'admin@pivotwatch.test', 'whatever');
    expect(unknown.body).toEqual(wrong.body);
    expect(unknown.status).toBe(wrong.status);
    const row = failures(s).find((r) => r.entityId === 'stranger@example.test');
    expect(row?.after).toMatchObject({ email: 'stranger@example.test', reason: 'unknown_account' });
  });

  test('a disabled account with its right password is recorded as disabled', async () => {
    const email = 'inspector@pivotwatch.test';
    s.db.update(users).set({ disabledAt: new Date().toISOString() }).where(eq(users.email, email)).run();
    try {
      expectApiError(await signIn(s, email, demoPassword), 401, 'account_disabled');
    } finally {
      s.db.update(users).set({ disabledAt: null }).where(eq(users.email, email)).run();
    }
    const row = failures(s).find((r) => r.entityId === userIdOf(s.db, email));
    expect(row?.after).toMatchObject({ reason: 'account_disabled' });
  });

  test('a successful sign-in and a malformed body write nothing', async () => {
    const before = failures(s).length;
    expect((await signIn(s, 'admin@pivotwatch.test', demoPassword)).status).toBe(200);
    expectApiError(
      await request(s.app).post('/api/auth/sign-in').send({ email: 'not-an-email' }),
      400,
      'validation_failed',
    );
    expect(failures(s)).toHaveLength(before);
  });
});
