/**
 * People administration over HTTP: invitations and reset links (single use, expiring), creating with a
 * password, role and company changes, disabling, the last-administrator guard and the audit trail. The
 * link lifetimes (7 days, 24 hours) and the password rule (12–200 characters, not the e-mail) are the
 * product's own rules from the issue; the token hash is checked against node's SHA-256 (FIPS 180-4).
 */
import { createHash } from 'node:crypto';

import { and, desc, eq, ne } from 'drizzle-orm';
import request from 'supertest';

import { accountMail, passwordLinks } from '@/db/server/accounts';
import { auditLog, companies, users } from '@/db/server/schema';
import { createApp } from '@/server/app';
import { loadConfig } from '@/server/config';
import { openDb } from '@/server/db';
import { createLogger } from '@/server/logger';
import { seedDemoData } from '@/server/seed/demo';

import { expectApiError, makeTempDir, signInAs, userIdOf } from './helpers';

const dataDir = makeTempDir();
const config = loadConfig({
  NODE_ENV: 'test',
  DATA_DIR: dataDir,
  WEB_DIR: `${dataDir}/none`,
  APP_URL: 'https://pw.example.test',
});
const database = openDb(dataDir);
const db = database.db;
/** The server's clock; tests move it forward to run links out, and back afterwards. */
let offsetMs = 0;
const app = createApp({
  db,
  config,
  logger: createLogger(config),
  signInLimit: { windowMs: 60_000, max: 10_000 },
  now: () => new Date(Date.now() + offsetMs),
});
let adminToken = '';
beforeAll(async () => {
  await seedDemoData(db, config);
  adminToken = await signInAs(app, 'admin@pivotwatch.test');
});
afterEach(() => {
  offsetMs = 0;
});
afterAll(() => database.close());

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
const me = (token: string) => request(app).get('/api/me').set(auth(token));
const asAdmin = {
  post: (path: string, body?: object) => request(app).post(path).set(auth(adminToken)).send(body),
  patch: (path: string, body: object) => request(app).patch(path).set(auth(adminToken)).send(body),
  get: (path: string) => request(app).get(path).set(auth(adminToken)),
};
const hourMs = 3_600_000;

/** The link in the newest e-mail queued for `email` (as the person would click it). */
function linkTokenFor(email: string): string {
  const row = db
    .select({ content: accountMail.content })
    .from(accountMail)
    .where(eq(accountMail.recipient, email))
    .orderBy(desc(accountMail.createdAt))
    .get();
  const match = /set-password\?token=([A-Za-z0-9_-]+)/.exec(row?.content?.text ?? '');
  if (!match) throw new Error(`no link queued for ${email}`);
  expect(row?.content?.text).toContain('https://pw.example.test/set-password?token=');
  return match[1];
}

/** Changes to a person's account, oldest first (failed sign-ins, written by the sign-in route, left out). */
const auditActionsFor = (userId: string) =>
  db
    .select({ action: auditLog.action, by: auditLog.userId })
    .from(auditLog)
    .where(
      and(eq(auditLog.entity, 'user'), eq(auditLog.entityId, userId), ne(auditLog.action, 'sign_in_failed')),
    )
    .orderBy(auditLog.at)
    .all();

let inviteCount = 0;
async function invite(role = 'inspector', extra: object = {}) {
  inviteCount += 1;
  const email = `new.person${inviteCount}@halvard.test`;
  const res = await asAdmin.post('/api/admin/users', {
    email,
    name: `Wren Aldous ${inviteCount}`,
    role,
    ...extra,
  });
  expect(res.status).toBe(201);
  return { email, id: res.body.user.id as string, body: res.body };
}

describe('invitations', () => {
  test('an invitation mails a link that works once, sets the password and signs the person in', async () => {
    const { email, id, body } = await invite();
    expect(body.invited).toBe(true);
    expect(body.user.state).toBe('invited');
    // Invited people cannot sign in with anything before they choose a password.
    expect(
      (await request(app).post('/api/auth/sign-in').send({ email, password: 'pivotwatch-demo' })).status,
    ).toBe(401);

    const token = linkTokenFor(email);
    // Only the SHA-256 of the token is stored, never the token.
    const stored = db.select().from(passwordLinks).where(eq(passwordLinks.userId, id)).get();
    expect(stored?.tokenSha256).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(db.select().from(passwordLinks).all())).not.toContain(token);

    const info = await request(app).get(`/api/auth/password-links/${token}`);
    expect(info.status).toBe(200);
    expect(info.body).toMatchObject({ purpose: 'invite', email, state: 'valid' });

    const set = await request(app)
      .post(`/api/auth/password-links/${token}`)
      .send({ password: 'a long enough secret' });
    expect(set.status).toBe(200);
    expect(set.body.user.email).toBe(email);
    expect((await me(set.body.token)).status).toBe(200);
    expect(
      (await request(app).post('/api/auth/sign-in').send({ email, password: 'a long enough secret' })).status,
    ).toBe(200);

    // Single use: the second try is refused and changes nothing.
    expectApiError(
      await request(app).post(`/api/auth/password-links/${token}`).send({ password: 'another long secret' }),
      410,
      'link_used',
    );
    expect((await request(app).get(`/api/auth/password-links/${token}`)).body.state).toBe('used');
    expect(
      (await request(app).post('/api/auth/sign-in').send({ email, password: 'a long enough secret' })).status,
    ).toBe(200);

    const list = await asAdmin.get('/api/admin/users');
    expect(list.body.users.find((u: { id: string }) => u.id === id).state).toBe('active');
    const adminId = userIdOf(db, 'admin@pivotwatch.test');
    expect(auditActionsFor(id)).toEqual([
      { action: 'invite', by: adminId },
      { action: 'password_set', by: id },
    ]);
  });

  test('an invitation runs out after 7 days', async () => {
    const { email } = await invite();
    const token = linkTokenFor(email);
    offsetMs = 7 * 24 * hourMs - 60_000;
    expect((await request(app).get(`/api/auth/password-links/${token}`)).body.state).toBe('valid');
    offsetMs = 7 * 24 * hourMs + 60_000;
    expect((await request(app).get(`/api/auth/password-links/${token}`)).body.state).toBe('expired');
    expectApiError(
      await request(app).post(`/api/auth/password-links/${token}`).send({ password: 'a long enough secret' }),
      410,
      'link_expired',
    );
  });

  test('unknown links are a 404 and a short or e-mail password a 400 naming the field', async () => {
    expectApiError(
      await request(app).get('/api/auth/password-links/nosuchtokenatallreally'),
      404,
      'not_found',
    );
    const { email } = await invite();
    const token = linkTokenFor(email);
    const short = expectApiError(
      await request(app).post(`/api/auth/password-links/${token}`).send({ password: 'eleven char' }),
      400,
      'validation_failed',
    );
    expect(short.issues?.[0]?.path).toBe('password');
    const same = expectApiError(
      await request(app).post(`/api/auth/password-links/${token}`).send({ password: email.toUpperCase() }),
      400,
      'validation_failed',
    );
    expect(same.issues?.[0]).toMatchObject({ path: 'password', message: expect.stringMatching(/e-mail/) });
    // Refused tries did not use the link up.
    expect((await request(app).get(`/api/auth/password-links/${token}`)).body.state).toBe('valid');
  });
});

describe('creating, changing and disabling', () => {
  test('a person created with a password signs in at once; a taken e-mail is a 409', async () => {
    const res = await asAdmin.post('/api/admin/users', {
      email: 'Tamsin.Reeve@Halvard.test',
      name: 'Tamsin Reeve',
      role: 'supervisor',
      password: 'twelve chars ok',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      invited: false,
      user: { email: 'tamsin.reeve@halvard.test', state: 'active' },
    });
    await signInAs(app, 'tamsin.reeve@halvard.test', 'twelve chars ok');
    expectApiError(
      await asAdmin.post('/api/admin/users', {
        email: 'tamsin.reeve@halvard.test',
        name: 'Again',
        role: 'inspector',
      }),
      409,
      'email_taken',
    );
    // An operator needs an operator company; staff may not have one.
    const noCompany = expectApiError(
      await asAdmin.post('/api/admin/users', { email: 'op@x.test', name: 'Op', role: 'operator' }),
      400,
      'validation_failed',
    );
    expect(noCompany.issues?.[0]?.path).toBe('companyId');
  });

  test('disabling refuses the person’s token at once; enabling lets them sign in again', async () => {
    const email = 'inspector@pivotwatch.test';
    const token = await signInAs(app, email);
    const id = userIdOf(db, email);
    expect((await asAdmin.post(`/api/admin/users/${id}/disable`)).body.user.state).toBe('disabled');
    expect((await me(token)).status).toBe(401);
    expectApiError(
      await request(app).post('/api/auth/sign-in').send({ email, password: 'pivotwatch-demo' }),
      401,
      'account_disabled',
    );
    expect((await asAdmin.post(`/api/admin/users/${id}/enable`)).body.user.state).toBe('active');
    // The old token stays ended; a new sign-in works.
    expect((await me(token)).status).toBe(401);
    expect((await me(await signInAs(app, email))).status).toBe(200);
    expect(auditActionsFor(id).map((a) => a.action)).toEqual(['disable', 'enable']);
  });

  test('a role or company change ends the person’s sessions; a name change does not', async () => {
    const email = 'supervisor@pivotwatch.test';
    const id = userIdOf(db, email);
    const token = await signInAs(app, email);
    const named = await asAdmin.patch(`/api/admin/users/${id}`, { name: 'Odile Marsh-Penrose' });
    expect(named.status).toBe(200);
    expect((await me(token)).status).toBe(200);

    const moved = await asAdmin.patch(`/api/admin/users/${id}`, { role: 'inspector' });
    expect(moved.body.user.role).toBe('inspector');
    expectApiError(await me(token), 401, 'session_ended');
    await asAdmin.patch(`/api/admin/users/${id}`, { role: 'supervisor' });

    const operatorEmail = 'operator@pivotwatch.test';
    const operatorId = userIdOf(db, operatorEmail);
    const operatorToken = await signInAs(app, operatorEmail);
    const current = db
      .select({ companyId: users.companyId })
      .from(users)
      .where(eq(users.id, operatorId))
      .get();
    const other = db
      .select({ id: companies.id })
      .from(companies)
      .where(eq(companies.kind, 'operator'))
      .all()
      .find((c) => c.id !== current?.companyId);
    expect(other).toBeDefined();
    expect((await asAdmin.patch(`/api/admin/users/${operatorId}`, { companyId: other!.id })).status).toBe(
      200,
    );
    expectApiError(await me(operatorToken), 401, 'session_ended');
    expect(auditActionsFor(id).map((a) => a.action)).toEqual(['update', 'update', 'update']);
    // An empty or unknown body changes nothing.
    expectApiError(await asAdmin.patch(`/api/admin/users/${id}`, {}), 400, 'validation_failed');
    expectApiError(
      await asAdmin.patch(`/api/admin/users/${id}`, { passwordHash: 'x' }),
      400,
      'validation_failed',
    );
  });

  test('the last active administrator cannot disable or demote themselves', async () => {
    const adminId = userIdOf(db, 'admin@pivotwatch.test');
    expectApiError(await asAdmin.post(`/api/admin/users/${adminId}/disable`), 409, 'last_admin');
    expectApiError(
      await asAdmin.patch(`/api/admin/users/${adminId}`, { role: 'supervisor' }),
      409,
      'last_admin',
    );
    expect((await me(adminToken)).status).toBe(200);
    // With a second administrator, stepping down is allowed.
    const second = await asAdmin.post('/api/admin/users', {
      email: 'second.admin@halvard.test',
      name: 'Ivo Castellane',
      role: 'admin',
      password: 'second admin pass',
    });
    expect(second.status).toBe(201);
    const secondToken = await signInAs(app, 'second.admin@halvard.test', 'second admin pass');
    expect(
      (await request(app).post(`/api/admin/users/${second.body.user.id}/disable`).set(auth(secondToken)))
        .status,
    ).toBe(200);
  });

  test('only administrators reach the people routes', async () => {
    const token = await signInAs(app, 'operator@pivotwatch.test');
    expectApiError(await request(app).get('/api/admin/users').set(auth(token)), 403, 'forbidden');
    expectApiError(
      await request(app)
        .post('/api/admin/users')
        .set(auth(token))
        .send({ email: 'a@b.test', name: 'A', role: 'admin' }),
      403,
      'forbidden',
    );
    expectApiError(await request(app).get('/api/admin/users'), 401, 'unauthorized');
  });
});

describe('resets and the person’s own change', () => {
  test('a reset stops the old password and sessions at once; its link runs out after 24 hours', async () => {
    const { id, email } = await invite('inspector');
    const first = await request(app)
      .post(`/api/auth/password-links/${linkTokenFor(email)}`)
      .send({ password: 'first password ok' });
    const token = first.body.token as string;
    const reset = await asAdmin.post(`/api/admin/users/${id}/reset`);
    expect(reset.status).toBe(200);
    expectApiError(await me(token), 401, 'session_ended');
    expect(
      (await request(app).post('/api/auth/sign-in').send({ email, password: 'first password ok' })).status,
    ).toBe(401);
    const link = linkTokenFor(email);
    expect((await request(app).get(`/api/auth/password-links/${link}`)).body).toMatchObject({
      purpose: 'reset',
      state: 'valid',
    });
    offsetMs = 24 * hourMs + 60_000;
    expectApiError(
      await request(app).post(`/api/auth/password-links/${link}`).send({ password: 'second password ok' }),
      410,
      'link_expired',
    );
    offsetMs = 0;
    // A second reset closes the first link; only the newest works.
    await asAdmin.post(`/api/admin/users/${id}/reset`);
    const newest = linkTokenFor(email);
    expect((await request(app).get(`/api/auth/password-links/${link}`)).body.state).toBe('expired');
    expect(
      (await request(app).post(`/api/auth/password-links/${newest}`).send({ password: 'second password ok' }))
        .status,
    ).toBe(200);
    expect(auditActionsFor(id).map((a) => a.action)).toEqual([
      'invite',
      'password_set',
      'password_reset',
      'password_reset',
      'password_set',
    ]);
  });

  test('changing one’s own password needs the current one, ends other sessions and keeps this device', async () => {
    const email = 'operator@pivotwatch.test';
    const laptop = await signInAs(app, email);
    const phone = await signInAs(app, email);
    const wrong = expectApiError(
      await request(app)
        .post('/api/auth/password')
        .set(auth(phone))
        .send({ currentPassword: 'nope', newPassword: 'a brand new secret' }),
      400,
      'validation_failed',
    );
    expect(wrong.issues?.[0]?.path).toBe('currentPassword');
    expect((await me(laptop)).status).toBe(200);

    const res = await request(app)
      .post('/api/auth/password')
      .set(auth(phone))
      .send({ currentPassword: 'pivotwatch-demo', newPassword: 'a brand new secret' });
    expect(res.status).toBe(200);
    expect((await me(res.body.token)).status).toBe(200);
    expectApiError(await me(laptop), 401, 'session_ended');
    expectApiError(await me(phone), 401, 'session_ended');
    expect(
      (await request(app).post('/api/auth/sign-in').send({ email, password: 'pivotwatch-demo' })).status,
    ).toBe(401);
    expect(auditActionsFor(userIdOf(db, email)).at(-1)?.action).toBe('password_change');
  });
});
