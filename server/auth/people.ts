/**
 * People administration: listing, creating (with a password or by invitation), changing name, role and
 * company, disabling and enabling, and sending a reset link. Every change writes an audit entry in its own
 * transaction, and the changes that alter what a person may do (role, company, disabling, a reset) end their
 * sessions at once (server/auth/sessions.ts). Set-password links themselves live in password-links.ts.
 */
import { randomBytes } from 'node:crypto';

import { and, asc, desc, eq, isNull, ne, sql } from 'drizzle-orm';

import { passwordLinks } from '@/db/server/accounts';
import { auditLog, companies, users } from '@/db/server/schema';
import type { AdminUser, CreatePersonBody, Person, UpdatePersonBody } from '@/features/admin/schema';
import type { Role, SessionUser } from '@/features/session/schema';
import { roleVocabulary } from '@/lib/vocabulary';
import { assertUserCompany, findSessionUser } from '@/server/auth/service';
import { hashPassword } from '@/server/auth/password';
import { issuePasswordLink } from '@/server/auth/password-links';
import { recordUserAudit } from '@/server/auth/user-audit';
import { endSessions } from '@/server/auth/sessions';
import type { Db } from '@/server/db';
import { conflict, HttpError, notFound } from '@/server/http/errors';

type Ctx = { now: Date; appUrl: string };

// Audit entries name users by id (entity_id); this subquery is the newest one about each person.
const lastChange = sql<
  string | null
>`(select max(${auditLog.at}) from ${auditLog} where ${auditLog.entity} = 'user' and ${auditLog.entityId} = ${users.id})`;
// Invited: an invitation was sent and no link of theirs was ever used to set a password.
const invitedCondition = sql<number>`exists (select 1 from ${passwordLinks} where ${passwordLinks.userId} = ${users.id} and ${passwordLinks.purpose} = 'invite') and not exists (select 1 from ${passwordLinks} where ${passwordLinks.userId} = ${users.id} and ${passwordLinks.usedAt} is not null)`;

const peopleColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  role: users.role,
  companyId: users.companyId,
  companyName: companies.name,
  createdAt: users.createdAt,
  disabledAt: users.disabledAt,
  lastChange,
  invited: invitedCondition,
};

type PeopleRow = {
  [K in keyof typeof peopleColumns]: K extends 'lastChange'
    ? string | null
    : K extends 'invited'
      ? number
      : K extends 'companyName'
        ? string | null
        : (typeof users.$inferSelect)[K & keyof typeof users.$inferSelect];
};

function toAdminUser({ lastChange: last, invited, ...row }: PeopleRow): AdminUser {
  return {
    ...row,
    role: row.role as Role,
    state: row.disabledAt !== null ? 'disabled' : invited ? 'invited' : 'active',
    lastChangeAt: last ?? row.createdAt,
  };
}

function peopleQuery(db: Pick<Db, 'select'>) {
  return db.select(peopleColumns).from(users).leftJoin(companies, eq(companies.id, users.companyId));
}

/** Everyone, for the people list (password hashes never leave the users table). */
export function listPeople(db: Pick<Db, 'select'>): AdminUser[] {
  return peopleQuery(db)
    .orderBy(asc(users.name), asc(users.email))
    .all()
    .map((r) => toAdminUser(r as PeopleRow));
}

/** The operator companies a person may belong to. */
export function companyChoices(db: Pick<Db, 'select'>) {
  return db
    .select({ id: companies.id, name: companies.name })
    .from(companies)
    .where(eq(companies.kind, 'operator'))
    .orderBy(asc(companies.name))
    .all();
}

function adminUser(db: Pick<Db, 'select'>, id: string): AdminUser {
  const row = peopleQuery(db).where(eq(users.id, id)).get();
  if (!row) throw notFound('No such person.');
  return toAdminUser(row as PeopleRow);
}

/** One person with the link waiting for them (if any) and the last 20 changes to their account. */
export function readPerson(db: Db, id: string, now: Date): Person {
  const user = adminUser(db, id);
  const link = db
    .select({
      purpose: passwordLinks.purpose,
      createdAt: passwordLinks.createdAt,
      expiresAt: passwordLinks.expiresAt,
    })
    .from(passwordLinks)
    .where(and(eq(passwordLinks.userId, id), isNull(passwordLinks.usedAt)))
    .orderBy(desc(passwordLinks.createdAt))
    .get();
  const history = db
    .select({ at: auditLog.at, action: auditLog.action, summary: auditLog.summary, by: users.name })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.userId))
    .where(and(eq(auditLog.entity, 'user'), eq(auditLog.entityId, id)))
    .orderBy(desc(auditLog.at))
    .limit(20)
    .all();
  const pendingLink = link && link.expiresAt > now.toISOString() ? link : null;
  return { ...user, pendingLink, history };
}

/** What an audit entry keeps of a person: never the password hash. */
const snapshot = (u: Pick<AdminUser, 'email' | 'name' | 'role' | 'companyId' | 'disabledAt'>) => ({
  email: u.email,
  name: u.name,
  role: u.role,
  companyId: u.companyId,
  disabledAt: u.disabledAt,
});

/** A hash no password matches: an invited or reset account cannot sign in until a link sets one. */
const unusableHash = () => hashPassword(randomBytes(32).toString('base64'));

/**
 * Creates a person. With a password they can sign in at once; without one they are invited by e-mail
 * (a link valid 7 days) and cannot sign in before they choose one.
 */
export async function createPerson(
  db: Db,
  actor: SessionUser,
  body: CreatePersonBody & { companyId: string | null },
  ctx: Ctx,
): Promise<{ user: AdminUser; invited: boolean }> {
  assertUserCompany(db, body.role, body.companyId);
  const email = body.email.trim().toLowerCase();
  const passwordHash = body.password === undefined ? await unusableHash() : await hashPassword(body.password);
  const invited = body.password === undefined;
  const id = db.transaction((tx) => {
    const taken = tx.select({ id: users.id }).from(users).where(eq(users.email, email)).get();
    if (taken) {
      throw new HttpError(409, 'email_taken', 'A person with this e-mail already exists.', [
        { path: 'email', message: 'Already in use' },
      ]);
    }
    const created = tx
      .insert(users)
      .values({
        email,
        name: body.name,
        role: body.role,
        companyId: body.companyId,
        passwordHash,
        createdAt: ctx.now.toISOString(),
      })
      .returning({ id: users.id })
      .get();
    const user = adminUser(tx, created.id);
    const roleWords = roleVocabulary[body.role].label;
    recordUserAudit(tx, {
      userId: actor.id,
      entityId: created.id,
      action: invited ? 'invite' : 'create',
      summary: invited
        ? `${user.name} invited as ${roleWords}`
        : `${user.name} added as ${roleWords} with a password`,
      after: snapshot(user),
    });
    if (invited) issuePasswordLink(tx, { user, purpose: 'invite', sender: actor, ...ctx });
    return created.id;
  });
  return { user: adminUser(db, id), invited };
}

/** Active administrators other than `exceptId`. */
function otherActiveAdmins(db: Pick<Db, 'select'>, exceptId: string): number {
  return db
    .select({ n: sql<number>`count(*)` })
    .from(users)
    .where(and(eq(users.role, 'admin'), isNull(users.disabledAt), ne(users.id, exceptId)))
    .get()!.n;
}

/** Someone must always be able to administer the install: the last active administrator stays one. */
function guardLastAdmin(db: Pick<Db, 'select'>, target: AdminUser, what: string) {
  if (target.role === 'admin' && target.disabledAt === null && otherActiveAdmins(db, target.id) === 0) {
    throw conflict(
      `${target.name} is the only active administrator, so the account cannot be ${what}. Make someone else an administrator first.`,
      'last_admin',
    );
  }
}

/** Changes name, role or company; a role or company change ends the person's sessions. */
export function updatePerson(db: Db, actor: SessionUser, id: string, patch: UpdatePersonBody, ctx: Ctx) {
  const before = adminUser(db, id);
  const role = patch.role ?? before.role;
  // An operator moved to inspection-body staff leaves their company unless the patch says otherwise.
  const companyId =
    patch.companyId !== undefined ? patch.companyId : role === 'operator' ? before.companyId : null;
  assertUserCompany(db, role, companyId);
  const name = patch.name ?? before.name;
  return db.transaction((tx) => {
    if (before.role === 'admin' && role !== 'admin') guardLastAdmin(tx, before, 'given another role');
    tx.update(users).set({ name, role, companyId }).where(eq(users.id, id)).run();
    const after = adminUser(tx, id);
    const accessChanged = role !== before.role || companyId !== before.companyId;
    if (accessChanged) endSessions(tx, id, ctx.now);
    const changes = [
      name !== before.name ? `name to ${name}` : null,
      role !== before.role ? `role to ${roleVocabulary[role].label}` : null,
      companyId !== before.companyId ? `company to ${after.companyName ?? 'none'}` : null,
    ].filter(Boolean);
    if (changes.length > 0) {
      recordUserAudit(tx, {
        userId: actor.id,
        entityId: id,
        action: 'update',
        summary: `${before.name}: ${changes.join(', ')}${accessChanged ? ' (signed out everywhere)' : ''}`,
        before: snapshot(before),
        after: snapshot(after),
      });
    }
    return after;
  });
}

/** Disables (ends every session at once) or enables an account. */
export function setDisabled(db: Db, actor: SessionUser, id: string, disabled: boolean, ctx: Ctx) {
  return db.transaction((tx) => {
    const before = adminUser(tx, id);
    if ((before.disabledAt !== null) === disabled) return before;
    if (disabled) guardLastAdmin(tx, before, 'disabled');
    tx.update(users)
      .set({ disabledAt: disabled ? ctx.now.toISOString() : null })
      .where(eq(users.id, id))
      .run();
    if (disabled) endSessions(tx, id, ctx.now);
    const after = adminUser(tx, id);
    recordUserAudit(tx, {
      userId: actor.id,
      entityId: id,
      action: disabled ? 'disable' : 'enable',
      summary: disabled ? `${before.name} disabled and signed out everywhere` : `${before.name} enabled`,
      before: snapshot(before),
      after: snapshot(after),
    });
    return after;
  });
}

/**
 * An administrator's reset: the current password stops working, every session ends, and the person gets
 * a link (valid 24 hours) to choose a new one. An invited person who never chose a password gets a fresh
 * invitation instead, valid 7 days again.
 */
export async function resetPerson(db: Db, actor: SessionUser, id: string, ctx: Ctx) {
  const target = adminUser(db, id);
  if (target.disabledAt !== null) {
    throw conflict(
      `${target.name}'s account is disabled. Enable it before sending a link.`,
      'account_disabled',
    );
  }
  const passwordHash = await unusableHash();
  const purpose = target.state === 'invited' ? 'invite' : 'reset';
  return db.transaction((tx) => {
    tx.update(users).set({ passwordHash }).where(eq(users.id, id)).run();
    endSessions(tx, id, ctx.now);
    issuePasswordLink(tx, { user: target, purpose, sender: actor, ...ctx });
    recordUserAudit(tx, {
      userId: actor.id,
      entityId: id,
      action: purpose === 'invite' ? 'invite' : 'password_reset',
      summary:
        purpose === 'invite'
          ? `${target.name} invited again`
          : `${target.name}: password reset, link sent, signed out everywhere`,
    });
    return adminUser(tx, id);
  });
}

/** The signed-in person as a session shows them (after a change of their own). */
export function sessionUserOf(db: Db, id: string): SessionUser {
  const user = findSessionUser(db, id);
  if (!user) throw notFound('No such person.');
  return user;
}

/**
 * The first administrator of an install, made from the command line (`npm run create-admin`). The audit
 * entry names the new administrator as its own author: there is no one else yet.
 */
export async function createAdministrator(
  db: Db,
  input: { email: string; name: string; password: string },
  now: Date,
): Promise<AdminUser> {
  const email = input.email.trim().toLowerCase();
  const passwordHash = await hashPassword(input.password);
  return db.transaction((tx) => {
    if (tx.select({ id: users.id }).from(users).where(eq(users.email, email)).get()) {
      throw conflict(`A person with the e-mail ${email} already exists.`, 'email_taken');
    }
    const { id } = tx
      .insert(users)
      .values({
        email,
        name: input.name,
        role: 'admin',
        passwordHash,
        companyId: null,
        createdAt: now.toISOString(),
      })
      .returning({ id: users.id })
      .get();
    const user = adminUser(tx, id);
    recordUserAudit(tx, {
      userId: id,
      entityId: id,
      action: 'create',
      summary: `${user.name} added as administrator from the command line`,
      after: snapshot(user),
    });
    return user;
  });
}
