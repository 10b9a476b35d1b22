import { eq } from 'drizzle-orm';
import request from 'supertest';

import { companies, users } from '@/db/server/schema';
import type { SessionUser } from '@/features/session/schema';
import { companyScope } from '@/server/auth/scope';
import { createUser } from '@/server/auth/service';
import { HttpError } from '@/server/http/errors';
import { demoRides, demoUsers } from '@/server/seed/demo';

import { expectApiError, makeTestServer, signInAs, type TestServer } from './helpers';

let server: TestServer;
const tokens: Record<string, string> = {};
beforeAll(async () => {
  server = await makeTestServer();
  for (const user of demoUsers) tokens[user.email] = await signInAs(server.app, user.email);
  // One password hash per demo account: slow on a busy machine.
}, 30_000);
afterAll(() => server.close());

const get = (path: string, email?: string) => {
  const req = request(server.app).get(path);
  return email ? req.set('Authorization', `Bearer ${tokens[email]}`) : req;
};

describe('GET /api/admin/users (admin only)', () => {
  test('an admin gets every user, without password hashes', async () => {
    const res = await get('/api/admin/users', 'admin@pivotwatch.test');
    expect(res.status).toBe(200);
    expect(res.body.users.map((u: SessionUser) => u.email).sort()).toEqual(
      demoUsers.map((u) => u.email).sort(),
    );
    expect(res.text).not.toMatch(/passwordHash|password_hash|\$2[aby]\$/);
  });

  test.each(['operator@pivotwatch.test', 'inspector@pivotwatch.test', 'supervisor@pivotwatch.test'])(
    '%s → 403 JSON',
    async (email) => {
      expectApiError(await get('/api/admin/users', email), 403, 'forbidden');
    },
  );

  test('without a token → 401 (not 403)', async () => {
    expectApiError(await get('/api/admin/users'), 401, 'unauthorized');
  });
});

describe('GET /api/rides is filtered to the caller', () => {
  const ridesOf = (operator: string) =>
    demoRides
      .filter((r) => r.operator === operator)
      .map((r) => r.name)
      .sort();

  test.each([
    ['operator@pivotwatch.test', 'Tamsworth Pier Leisure'],
    ['operator2@pivotwatch.test', 'Corvane Travelling Shows'],
  ])('%s sees only the rides of %s', async (email, company) => {
    const res = await get('/api/rides', email);
    expect(res.status).toBe(200);
    const names = res.body.rides.map((r: { name: string }) => r.name).sort();
    expect(names).toEqual(ridesOf(company));
    expect(names.length).toBeGreaterThan(0);
    for (const ride of res.body.rides) expect(ride.operatorName).toBe(company);
  });

  test.each(['inspector@pivotwatch.test', 'supervisor@pivotwatch.test', 'admin@pivotwatch.test'])(
    '%s sees every ride, with site and operator names',
    async (email) => {
      const res = await get('/api/rides', email);
      expect(res.status).toBe(200);
      expect(res.body.rides).toHaveLength(demoRides.length);
      const tidebreaker = res.body.rides.find((r: { name: string }) => r.name === 'Tidebreaker');
      expect(tidebreaker).toMatchObject({
        rideClass: 'rotating_arm',
        siteName: 'Lowfield Common fairground',
        operatorName: 'Corvane Travelling Shows',
        status: 'restricted',
      });
      expect(tidebreaker.statusReason).toEqual(expect.any(String));
    },
  );

  test('without a token → 401', async () => {
    expectApiError(await get('/api/rides'), 401, 'unauthorized');
  });
});

describe('companyScope', () => {
  const base: SessionUser = {
    id: 'u1',
    email: 'x@example.test',
    name: 'X',
    role: 'inspector',
    companyId: null,
    companyName: null,
  };

  test('staff are not limited; operators are limited to their company', () => {
    expect(companyScope(base)).toBeNull();
    expect(companyScope({ ...base, role: 'admin' })).toBeNull();
    expect(companyScope({ ...base, role: 'operator', companyId: 'c1', companyName: 'C' })).toBe('c1');
  });

  test('an operator without a company is refused rather than shown everything', () => {
    expect(() => companyScope({ ...base, role: 'operator' })).toThrow(HttpError);
  });
});

describe('operator users must belong to an operator company', () => {
  test('the service refuses an operator without a company, or with the inspection body', async () => {
    await expect(
      createUser(server.db, {
        email: 'a@x.test',
        name: 'A',
        role: 'operator',
        password: 'pw-123456',
        companyId: null,
      }),
    ).rejects.toMatchObject({ status: 400, code: 'validation_failed' });
    const body = server.db
      .select({ id: companies.id })
      .from(companies)
      .where(eq(companies.kind, 'inspection_body'))
      .get();
    await expect(
      createUser(server.db, {
        email: 'b@x.test',
        name: 'B',
        role: 'operator',
        password: 'pw-123456',
        companyId: body?.id ?? null,
      }),
    ).rejects.toMatchObject({ status: 400 });
  });

  test('the database refuses it too', () => {
    expect(() =>
      server.db
        .insert(users)
        .values({ email: 'c@x.test', name: 'C', role: 'operator', passwordHash: 'x', companyId: null })
        .run(),
    ).toThrow(/CHECK constraint failed/);
  });

  test('a duplicate e-mail → 409', async () => {
    await expect(
      createUser(server.db, {
        email: 'ADMIN@pivotwatch.test',
        name: 'Dup',
        role: 'admin',
        password: 'pw-123456',
        companyId: null,
      }),
    ).rejects.toMatchObject({ status: 409, code: 'email_taken' });
  });
});
