import { timestamp } from '@/features/registry/schema/fields';
import { pageSchema, pagingQuerySchema, searchQuery, sortQuery } from '@/lib/list-params';
import { listOf } from '@/features/registry/schema/rides';
import { z } from 'zod';

// ——— audit log ———

export const auditEntities = [
  'company',
  'site',
  'ride',
  'design',
  'checklist_template',
  'schedule',
  'inspection',
  'finding',
  'notice',
  'corrective_action',
  'instrument',
  'setting',
  'user',
  'incident',
  'bulletin',
  'bulletin_action',
  'setup',
  'site_event',
  'round',
] as const;
export const auditEntitySchema = z.enum(auditEntities);
export type AuditEntity = z.infer<typeof auditEntitySchema>;
/**
 * What happened. Beyond create/update/delete, people and sessions have their own words: an invitation, a
 * password set by a link or changed by its owner, an administrator's reset, disabling and re-enabling, a
 * server-side sign-out and a failed sign-in (kept so an administrator can see who is being tried).
 */
export const auditActions = [
  'create',
  'update',
  'delete',
  'invite',
  'password_set',
  'password_change',
  'password_reset',
  'disable',
  'enable',
  'sign_out',
  'sign_in_failed',
] as const;
export const auditActionSchema = z.enum(auditActions);
export type AuditAction = z.infer<typeof auditActionSchema>;

// ——— audit log ———

export const auditEntrySchema = z.object({
  id: z.string(),
  at: z.string(),
  userId: z.string().nullable(),
  userName: z.string().nullable(),
  entity: auditEntitySchema,
  entityId: z.string(),
  action: auditActionSchema,
  rideId: z.string().nullable(),
  summary: z.string(),
  /** The record before the change (null for a create) and after it (null for a delete). */
  before: z.unknown(),
  after: z.unknown(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

/** `GET /api/audit`: newest first unless `sort=at`; `from`/`to` are inclusive instants or dates. */
export const auditListQuerySchema = pagingQuerySchema.extend({
  entity: listOf(auditEntities).optional(),
  action: listOf(auditActions).optional(),
  entityId: z.string().trim().min(1).optional(),
  rideId: z.string().trim().min(1).optional(),
  userId: z.string().trim().min(1).optional(),
  from: timestamp().optional(),
  to: z
    .string()
    .trim()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined) return undefined;
      // A bare date means the whole of that day.
      const dateOnly = /^\d{4}-\d{2}-\d{2}$/.test(v);
      const parsed = timestamp().safeParse(dateOnly ? `${v}T23:59:59.999Z` : v);
      if (!parsed.success) {
        ctx.addIssue({ code: 'custom', message: 'Must be a date or date-time, e.g. 2025-05-01' });
        return z.NEVER;
      }
      return parsed.data;
    }),
  q: searchQuery(),
  sort: sortQuery(['at'] as const).optional(),
});
export type AuditListQuery = z.output<typeof auditListQuerySchema>;
export const auditListResponseSchema = pageSchema.extend({ entries: z.array(auditEntrySchema) });
