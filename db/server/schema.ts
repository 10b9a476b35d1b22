import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

import type { DesignData } from '@/features/loads/design-schema';
import {
  auditActions,
  auditEntities,
  designApprovalStates,
  designOrigins,
  type ChecklistContent,
  type CompanyContact,
} from '@/features/registry/schema';
import {
  companyKinds,
  inspectionTypes,
  noticeUnitSystems,
  paperSizes,
  rideClasses,
  rideStatuses,
  roles,
  siteKinds,
  type CompanyKind,
  type RideClass,
  type RideStatus,
  type SiteKind,
} from '@/lib/vocabulary';
import { col, oneOf } from '@/db/server/checks';

/*
 * The server's tables. Timestamps are ISO 8601 UTC strings so they read the same in SQL, JSON and logs.
 * Enumerations are checked by the database too, so a bad value can't slip in through a script or a
 * hand-run query.
 */

// The enumerations are the vocabulary's (lib/vocabulary.ts): one list for the app, the API and the database.
export { companyKinds, rideClasses, rideStatuses, siteKinds };
export type { CompanyKind, RideClass, RideStatus, SiteKind };

const id = () =>
  text('id')
    .primaryKey()
    .$defaultFn(() => randomUUID());
const createdAt = () =>
  text('created_at')
    .notNull()
    .$defaultFn(() => new Date().toISOString());

export const companies = sqliteTable(
  'companies',
  {
    id: id(),
    kind: text('kind', { enum: companyKinds }).notNull(),
    name: text('name').notNull(),
    /** Where notices go; a JSON array of addresses (empty for the inspection body). */
    noticeEmails: text('notice_emails', { mode: 'json' })
      .$type<string[]>()
      .notNull()
      .default(sql`'[]'`),
    phone: text('phone'),
    /** Postal address, one string with line breaks as written. */
    address: text('address'),
    /** People to talk to: a JSON array of { name, role?, email?, phone? }. */
    contacts: text('contacts', { mode: 'json' })
      .$type<CompanyContact[]>()
      .notNull()
      .default(sql`'[]'`),
    /**
     * The units and paper of the company's notices (frozen into each notice when issued). Checked by the
     * API's schema, not by a CHECK: SQLite can add a CHECK only by rebuilding the table, and other tables'
     * rows refer to this one, so a rebuild's DROP would be refused.
     */
    noticeUnits: text('notice_units', { enum: noticeUnitSystems }).notNull().default('si'),
    noticePaper: text('notice_paper', { enum: paperSizes }).notNull().default('A4'),
    createdAt: createdAt(),
  },
  (t) => [check('companies_kind_check', oneOf(t.kind, companyKinds)), index('companies_name_idx').on(t.name)],
);

export const users = sqliteTable(
  'users',
  {
    id: id(),
    email: text('email').notNull().unique(),
    name: text('name').notNull(),
    role: text('role', { enum: roles }).notNull(),
    passwordHash: text('password_hash').notNull(),
    /** Operator users belong to exactly one operator company; the inspection body's staff have none. */
    companyId: text('company_id').references(() => companies.id, { onDelete: 'restrict' }),
    createdAt: createdAt(),
    disabledAt: text('disabled_at'),
    /**
     * Session tokens issued before this instant (ISO 8601 UTC) are refused on every request. Moved by
     * sign-out, a password change or reset, disabling and a role or company change (server/auth/sessions.ts).
     */
    tokensValidAfter: text('tokens_valid_after'),
  },
  (t) => [
    check('users_role_check', oneOf(t.role, roles)),
    // Sign-in lowercases the address before the lookup, so a mixed-case row could never sign in.
    check('users_email_lowercase_check', sql`${col(t.email)} = lower(${col(t.email)})`),
    check(
      'users_operator_company_check',
      sql`${col(t.role)} <> 'operator' OR ${col(t.companyId)} IS NOT NULL`,
    ),
    index('users_company_idx').on(t.companyId),
  ],
);

export const sites = sqliteTable(
  'sites',
  {
    id: id(),
    name: text('name').notNull(),
    kind: text('kind', { enum: siteKinds }).notNull(),
    address: text('address'),
    locality: text('locality'),
    /**
     * The site's IANA time zone ("Pacific/Auckland"): its "today", due dates, reminder hour and the times
     * shown for it. Null means the inspection body's default (the `time_zone` setting).
     */
    timeZone: text('time_zone'),
    operatorCompanyId: text('operator_company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'restrict' }),
    createdAt: createdAt(),
  },
  (t) => [
    check('sites_kind_check', oneOf(t.kind, siteKinds)),
    index('sites_operator_company_idx').on(t.operatorCompanyId),
    index('sites_name_idx').on(t.name),
  ],
);

export const rides = sqliteTable(
  'rides',
  {
    id: id(),
    name: text('name').notNull(),
    rideClass: text('ride_class', { enum: rideClasses }).notNull(),
    /** One line on the ride's configuration (e.g. "arm with a gondola at each tip"), shown beside the name. */
    description: text('description'),
    maker: text('maker'),
    model: text('model'),
    serial: text('serial'),
    year: integer('year'),
    /** Null while a travelling ride is in store between set-ups. */
    siteId: text('site_id').references(() => sites.id, { onDelete: 'restrict' }),
    operatorCompanyId: text('operator_company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'restrict' }),
    status: text('status', { enum: rideStatuses }).notNull().default('in_service'),
    statusReason: text('status_reason'),
    statusSince: text('status_since')
      .notNull()
      .$defaultFn(() => new Date().toISOString()),
    createdAt: createdAt(),
  },
  (t) => [
    check('rides_class_check', oneOf(t.rideClass, rideClasses)),
    check('rides_status_check', oneOf(t.status, rideStatuses)),
    // A ride taken out of plain service must say why, or the operator's notice would be empty.
    check(
      'rides_status_reason_check',
      sql`${col(t.status)} = 'in_service' OR ${col(t.statusReason)} IS NOT NULL`,
    ),
    index('rides_operator_company_idx').on(t.operatorCompanyId),
    index('rides_site_idx').on(t.siteId),
    // The register's sorts and filters.
    index('rides_name_idx').on(t.name),
    index('rides_status_idx').on(t.status, t.name),
    index('rides_class_idx').on(t.rideClass, t.name),
  ],
);

/**
 * A ride's design data, one row per version. Rows are only ever inserted: inspections and analyses name
 * the version they used, so an old result can be reproduced from the data it was computed with. The
 * current design data is the ride's highest version.
 */
export const designVersions = sqliteTable(
  'design_versions',
  {
    id: id(),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    /** 1, 2, 3… per ride. */
    version: integer('version').notNull(),
    /** The whole DesignData object (features/registry/design-data.ts), validated before it is stored. */
    data: text('data', { mode: 'json' }).$type<DesignData>().notNull(),
    /** Why this version was made ("maker's revision D of the design report", "pin replaced by 150 mm"). */
    reason: text('reason').notNull(),
    /** How it came in: typed in the app, imported from a file, or the demo seed. */
    origin: text('origin', { enum: designOrigins }).notNull(),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    createdAt: createdAt(),
    /**
     * Only versions in force are used by analyses and phones: one that loosens a limit waits as `pending`
     * until a second person (not its proposer, `createdBy`) approves or rejects it. Earlier rows are in force.
     */
    approvalState: text('approval_state', { enum: designApprovalStates }).notNull().default('in_force'),
    /** The version in force this one was compared with when it was made; null for a ride's first version. */
    basedOnVersion: integer('based_on_version'),
    decidedBy: text('decided_by').references(() => users.id, { onDelete: 'restrict' }),
    decidedAt: text('decided_at'),
    decisionReason: text('decision_reason'),
  },
  (t) => [
    check('design_versions_origin_check', oneOf(t.origin, designOrigins)),
    check('design_versions_version_check', sql`${col(t.version)} >= 1`),
    // Also the index for "latest version of this ride".
    uniqueIndex('design_versions_ride_version_idx').on(t.rideId, t.version),
  ],
);

/**
 * A checklist template for one ride class and, optionally, one inspection type. Its areas and items live
 * in versions, like design data, so an inspection can always show the checklist it was filled against.
 * Deleting a template archives it.
 */
export const checklistTemplates = sqliteTable(
  'checklist_templates',
  {
    id: id(),
    name: text('name').notNull(),
    rideClass: text('ride_class', { enum: rideClasses }).notNull(),
    /**
     * The inspection type it is for; null = the class's general checklist, used for any type without one of
     * its own (every template made before types existed). No CHECK: SQLite adds one only by rebuilding a
     * table that inspections refer to; the API validates the value.
     */
    inspectionType: text('inspection_type', { enum: inspectionTypes }),
    createdAt: createdAt(),
    archivedAt: text('archived_at'),
  },
  (t) => [
    check('checklist_templates_class_check', oneOf(t.rideClass, rideClasses)),
    index('checklist_templates_class_idx').on(t.rideClass, t.name),
  ],
);

export const checklistTemplateVersions = sqliteTable(
  'checklist_template_versions',
  {
    id: id(),
    templateId: text('template_id')
      .notNull()
      .references(() => checklistTemplates.id, { onDelete: 'restrict' }),
    version: integer('version').notNull(),
    /** Areas and items with their ids (features/registry/schema.ts, storedChecklistContentSchema). */
    content: text('content', { mode: 'json' }).$type<ChecklistContent>().notNull(),
    reason: text('reason').notNull(),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    createdAt: createdAt(),
  },
  (t) => [
    check('checklist_template_versions_version_check', sql`${col(t.version)} >= 1`),
    uniqueIndex('checklist_template_versions_template_version_idx').on(t.templateId, t.version),
  ],
);

/**
 * When each kind of inspection of a ride falls due: one row per ride and inspection type, with its interval,
 * the last time it was done, an optional explicit due date, and the inspector it is assigned to. Dates are
 * calendar dates (YYYY-MM-DD); the due status is computed from them at read time, never stored.
 */
export const inspectionSchedules = sqliteTable(
  'inspection_schedules',
  {
    id: id(),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    inspectionType: text('inspection_type', { enum: inspectionTypes }).notNull(),
    intervalDays: integer('interval_days'),
    lastDoneOn: text('last_done_on'),
    dueOn: text('due_on'),
    assignedTo: text('assigned_to').references(() => users.id, { onDelete: 'restrict' }),
    assignedAt: text('assigned_at'),
    notes: text('notes'),
    createdAt: createdAt(),
  },
  (t) => [
    check('inspection_schedules_type_check', oneOf(t.inspectionType, inspectionTypes)),
    check(
      'inspection_schedules_interval_check',
      sql`${col(t.intervalDays)} IS NULL OR ${col(t.intervalDays)} > 0`,
    ),
    uniqueIndex('inspection_schedules_ride_type_idx').on(t.rideId, t.inspectionType),
    index('inspection_schedules_assignee_idx').on(t.assignedTo),
  ],
);

/**
 * Every create, update and delete on the register, design data, checklist templates and schedules: who,
 * when, what, and the record before and after (JSON; null before a create and after a delete). Rows are
 * only ever inserted, in the same transaction as the change they describe.
 */
export const auditLog = sqliteTable(
  'audit_log',
  {
    id: id(),
    at: text('at')
      .notNull()
      .$defaultFn(() => new Date().toISOString()),
    /** Null only for changes made by the system itself (none yet: the demo seed writes no entries). */
    userId: text('user_id').references(() => users.id, { onDelete: 'restrict' }),
    entity: text('entity', { enum: auditEntities }).notNull(),
    entityId: text('entity_id').notNull(),
    action: text('action', { enum: auditActions }).notNull(),
    /** The ride a change belongs to (a ride, its design data, its schedules), for the ride's history. */
    rideId: text('ride_id'),
    /** One line for lists ("Skylark: design data version 3"). */
    summary: text('summary').notNull(),
    before: text('before', { mode: 'json' }).$type<unknown>(),
    after: text('after', { mode: 'json' }).$type<unknown>(),
  },
  (t) => [
    check('audit_log_entity_check', oneOf(t.entity, auditEntities)),
    check('audit_log_action_check', oneOf(t.action, auditActions)),
    index('audit_log_at_idx').on(t.at),
    index('audit_log_entity_idx').on(t.entity, t.entityId, t.at),
    index('audit_log_ride_idx').on(t.rideId, t.at),
    index('audit_log_user_idx').on(t.userId, t.at),
  ],
);

export type Company = typeof companies.$inferSelect;
export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;
export type Site = typeof sites.$inferSelect;
export type Ride = typeof rides.$inferSelect;
export type DesignVersion = typeof designVersions.$inferSelect;
