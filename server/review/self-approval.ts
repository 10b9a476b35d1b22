/**
 * Whether a supervisor may approve an inspection they recorded themselves: an inspection body setting,
 * refused unless an administrator allows it. An approval moves the ride's schedule and can put a ride back
 * into service, so by default it takes a second person. Returning one's own inspection is always allowed
 * (it changes nothing the operator relies on).
 */
import { eq } from 'drizzle-orm';

import { settings } from '@/db/server/instruments';
import { users } from '@/db/server/schema';
import type { SelfApprovalSetting } from '@/features/review/schema';
import type { SessionUser } from '@/features/session/schema';
import type { Db } from '@/server/db';
import { recordAudit } from '@/server/registry/audit';

type Reader = Pick<Db, 'select'>;

const SELF_APPROVAL_KEY = 'self_approval';

export function getSelfApprovalSetting(db: Reader): SelfApprovalSetting {
  const row = db
    .select({ value: settings.value, updatedAt: settings.updatedAt, updatedByName: users.name })
    .from(settings)
    .leftJoin(users, eq(users.id, settings.updatedBy))
    .where(eq(settings.key, SELF_APPROVAL_KEY))
    .get();
  const value = row?.value as { allowed?: unknown } | undefined;
  // Anything but an explicit `true` keeps the safe default.
  if (!row || typeof value?.allowed !== 'boolean')
    return { allowed: false, updatedAt: null, updatedByName: null };
  return { allowed: value.allowed, updatedAt: row.updatedAt, updatedByName: row.updatedByName };
}

export function setSelfApproval(
  db: Db,
  userId: string,
  allowed: boolean,
  now = new Date(),
): SelfApprovalSetting {
  return db.transaction((tx) => {
    const before = getSelfApprovalSetting(tx);
    const at = now.toISOString();
    tx.insert(settings)
      .values({ key: SELF_APPROVAL_KEY, value: { allowed }, updatedAt: at, updatedBy: userId })
      .onConflictDoUpdate({
        target: settings.key,
        set: { value: { allowed }, updatedAt: at, updatedBy: userId },
      })
      .run();
    recordAudit(tx, {
      userId,
      entity: 'setting',
      entityId: SELF_APPROVAL_KEY,
      action: before.updatedAt === null ? 'create' : 'update',
      summary: allowed
        ? 'Supervisors may now approve inspections they recorded'
        : 'Supervisors may no longer approve inspections they recorded',
      before: { allowed: before.allowed },
      after: { allowed },
    });
    return getSelfApprovalSetting(tx);
  });
}

/**
 * Why `user` may not approve an inspection recorded by `inspectorId`, or null when they may (or decide
 * nothing at all: inspectors and operators are refused by their role, not by this rule).
 */
export function approvalRefusal(db: Reader, user: SessionUser, inspectorId: string): string | null {
  if (user.role !== 'supervisor' && user.role !== 'admin') return null;
  if (user.id !== inspectorId || getSelfApprovalSetting(db).allowed) return null;
  return (
    'You recorded this inspection, so another supervisor must approve it (an administrator can allow ' +
    'approving one’s own inspections). You may still return it.'
  );
}
