import type Database from 'better-sqlite3';
import { asc, eq, getTableName, sql } from 'drizzle-orm';

import { companies, users } from '@/db/server/schema';
import type { SignInBody, SignInResponse } from '@/features/auth/schema';
import type { Role, SessionUser } from '@/features/session/schema';
import { signSessionToken } from '@/server/auth/jwt';
import { hashPassword, verifyPassword } from '@/server/auth/password';
import type { Config } from '@/server/config';
import type { Db } from '@/server/db';
import { HttpError, unauthorized } from '@/server/http/errors';
import { sqliteOf } from '@/server/sqlite-client';

const badCredentials = () => unauthorized('E-mail or password is incorrect.', 'invalid_credentials');

const sessionUserColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  role: users.role,
  companyId: users.companyId,
  companyName: companies.name,
};

// Every authenticated request reads its user: the query is prepared once per database.
const preparedSessionUser = new WeakMap<Db, ReturnType<typeof prepareSessionUser>>();
const prepareSessionUser = (db: Db) =>
  db
    .select({ ...sessionUserColumns, disabledAt: users.disabledAt, tokensValidAfter: users.tokensValidAfter })
    .from(users)
    .leftJoin(companies, eq(companies.id, users.companyId))
    .where(eq(users.id, sql.placeholder('userId')))
    .prepare();
function sessionUserQuery(db: Db) {
  let query = preparedSessionUser.get(db);
  if (!query) {
    query = prepareSessionUser(db);
    preparedSessionUser.set(db, query);
  }
  return query;
}

type SessionUserRow = SessionUser & { disabledAt: string | null; tokensValidAfter: string | null };

/**
 * The same read on the connection itself. drizzle's prepared query maps every row through its column
 * decoders, which cost several times the lookup on a request that does little else (the review queue
 * answers from memory). A transaction has no connection of its own, so it takes the drizzle query.
 */
const rawSessionUser = new WeakMap<Database.Database, Database.Statement<[string], SessionUserRow>>();
function sessionUserRow(db: Db, userId: string): SessionUserRow | undefined {
  if (!('$client' in db)) return sessionUserQuery(db).get({ userId });
  const sqlite = sqliteOf(db);
  let statement = rawSessionUser.get(sqlite);
  if (!statement) {
    const u = (column: { name: string }) => `u."${column.name}"`;
    statement = sqlite.prepare<[string], SessionUserRow>(
      `SELECT ${u(users.id)} AS id, ${u(users.email)} AS email, ${u(users.name)} AS name, ${u(users.role)} AS role, ` +
        `${u(users.companyId)} AS companyId, c."${companies.name.name}" AS companyName, ` +
        `${u(users.disabledAt)} AS disabledAt, ${u(users.tokensValidAfter)} AS tokensValidAfter ` +
        `FROM "${getTableName(users)}" u LEFT JOIN "${getTableName(companies)}" c ` +
        `ON c."${companies.id.name}" = ${u(users.companyId)} WHERE ${u(users.id)} = ?`,
    );
    rawSessionUser.set(sqlite, statement);
  }
  return statement.get(userId);
}

/** The signed-in user as the API shows it, or null when the account is missing or disabled. */
export function findSessionUser(db: Db, userId: string): SessionUser | null {
  return findSessionUserWithStamp(db, userId)?.user ?? null;
}

/**
 * The signed-in user and the instant before which their tokens are refused (ms since the epoch, or null when
 * no session was ever ended), in one read: `requireAuth` runs this on every request.
 */
export function findSessionUserWithStamp(
  db: Db,
  userId: string,
): { user: SessionUser; tokensValidAfterMs: number | null } | null {
  const row = sessionUserRow(db, userId);
  if (!row || row.disabledAt !== null) return null;
  const { disabledAt: _disabledAt, tokensValidAfter, ...user } = row;
  return { user, tokensValidAfterMs: tokensValidAfter === null ? null : Date.parse(tokensValidAfter) };
}

/** Why a sign-in was refused, for the audit log only (the answer never tells an unknown e-mail apart). */
export type SignInFailure = {
  /** The account tried, when one has this e-mail. */
  userId: string | null;
  reason: 'wrong_password' | 'unknown_account' | 'account_disabled';
};

export async function signIn(
  db: Db,
  config: Config,
  body: SignInBody,
  onFailure?: (failure: SignInFailure) => void,
): Promise<SignInResponse> {
  const row = db
    .select({ id: users.id, passwordHash: users.passwordHash, disabledAt: users.disabledAt })
    .from(users)
    .where(eq(users.email, body.email.toLowerCase()))
    .get();
  // Unknown e-mail and wrong password take the same path, time and answer.
  const passwordOk = await verifyPassword(body.password, row?.passwordHash ?? null);
  if (!row || !passwordOk) {
    onFailure?.({ userId: row?.id ?? null, reason: row ? 'wrong_password' : 'unknown_account' });
    throw badCredentials();
  }
  if (row.disabledAt !== null) {
    onFailure?.({ userId: row.id, reason: 'account_disabled' });
    // Only someone who knows the password learns the account exists, and they need to know why it fails.
    throw unauthorized('This account is disabled. Ask an administrator to restore it.', 'account_disabled');
  }
  const user = findSessionUser(db, row.id);
  if (!user) throw badCredentials();
  const { token, expiresAt } = await signSessionToken(user, config);
  return { token, expiresAt, user };
}

/**
 * Operators must belong to an operator company (that is what limits what they can read); the inspection
 * body's staff belong to none. The database enforces the first half too; this gives a readable error.
 */
export function assertUserCompany(db: Db, role: Role, companyId: string | null): void {
  if (role !== 'operator') {
    if (companyId !== null) {
      throw new HttpError(400, 'validation_failed', 'Only operator users belong to a company.', [
        { path: 'companyId', message: 'Leave empty for inspectors, supervisors and admins' },
      ]);
    }
    return;
  }
  const company =
    companyId === null
      ? undefined
      : db.select({ kind: companies.kind }).from(companies).where(eq(companies.id, companyId)).get();
  if (company?.kind !== 'operator') {
    throw new HttpError(400, 'validation_failed', 'An operator user needs an operator company.', [
      { path: 'companyId', message: 'Choose the operator company this user works for' },
    ]);
  }
}

type NewUserInput = {
  email: string;
  name: string;
  role: Role;
  password: string;
  companyId: string | null;
};

export async function createUser(db: Db, input: NewUserInput): Promise<SessionUser> {
  assertUserCompany(db, input.role, input.companyId);
  const passwordHash = await hashPassword(input.password);
  const email = input.email.trim().toLowerCase();
  const existing = db.select({ id: users.id }).from(users).where(eq(users.email, email)).get();
  if (existing) throw new HttpError(409, 'email_taken', 'A user with this e-mail already exists.');
  const { id } = db
    .insert(users)
    .values({ email, name: input.name, role: input.role, passwordHash, companyId: input.companyId })
    .returning({ id: users.id })
    .get();
  const user = findSessionUser(db, id);
  if (!user) throw new Error('user vanished right after insert');
  return user;
}

type AdminUserRow = SessionUser & { createdAt: string; disabledAt: string | null };

/** Every user, for the admin's people list. Password hashes never leave this module. */
export function listUsers(db: Db): AdminUserRow[] {
  return db
    .select({ ...sessionUserColumns, createdAt: users.createdAt, disabledAt: users.disabledAt })
    .from(users)
    .leftJoin(companies, eq(companies.id, users.companyId))
    .orderBy(asc(users.role), asc(users.name))
    .all();
}
