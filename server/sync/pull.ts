/**
 * GET /api/sync/pull, the service: what a phone needs to work without signal (rides with their current
 * design data, checklist templates for those rides' classes, the caller's assignments, supervisors'
 * decisions on the caller's inspections), everything on the first pull and then only what changed; the
 * instrument register and the declaration text come whole on every pull.
 *
 * The cursor is the time the previous answer was read, "v1:<ISO time>". Changes are found by their
 * timestamps (rows' created_at and the audit log every registry change writes), looking back a few
 * seconds before the cursor: a write stamped just before a pull but committed by another process just
 * after it is sent on the next pull instead of lost. The phone stores everything by id, so what the
 * overlap sends twice is harmless.
 */
import { and, asc, eq, gte, inArray, isNotNull, ne, or, sql } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { findings } from '@/db/server/review';
import {
  auditLog,
  checklistTemplates,
  checklistTemplateVersions,
  designVersions,
  rides,
  users,
} from '@/db/server/schema';
import { DAILY_CHECK_TYPE } from '@/features/daily-checks/schema';
import type { SessionUser } from '@/features/session/schema';
import type { RideSummary } from '@/features/rides/schema';
import type { PulledDecisionFinding, PullResponse } from '@/features/sync/pull-schema';
import { companyScope } from '@/server/auth/scope';
import { openBulletinsOf, ridesWithActionsSince } from '@/server/bulletins/on-rides';
import type { Db } from '@/server/db';
import { HttpError } from '@/server/http/errors';
import { getDeclarationSetting, listInstruments } from '@/server/instruments/instruments';
import { findChecklistTemplate, listChecklistTemplates } from '@/server/registry/checklists';
import { findDesignVersion } from '@/server/registry/design';
import { findRide } from '@/server/registry/rides';
import { assignmentsOf } from '@/server/registry/schedules';
import { findingNumber } from '@/server/findings/findings';

/** How far before the cursor changes are looked for again (clock skew between processes, slow commits). */
const CURSOR_OVERLAP_MS = 5_000;

const CURSOR_PREFIX = 'v1:';

const cursorOf = (at: Date) => `${CURSOR_PREFIX}${at.toISOString()}`;

/** The time a cursor stands for; a 400 naming the parameter when it is not one this server gave out. */
function parseCursor(cursor: string): Date {
  const iso = cursor.startsWith(CURSOR_PREFIX) ? cursor.slice(CURSOR_PREFIX.length) : '';
  const at = new Date(iso);
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/.test(iso) || Number.isNaN(at.getTime()))
    throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
      {
        path: 'query.cursor',
        message: 'Not a cursor from this server; pull without a cursor to download everything again',
      },
    ]);
  return at;
}

type Decision = {
  inspectionId: string;
  rideId: string;
  state: string;
  note: string | null;
  decidedAt: string;
  decidedByName: string | null;
  /** The supervisor's findings on the inspection, in number order. */
  findings: PulledDecisionFinding[];
};

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** What every part of an answer works from: the rides the caller may see and what changed since. */
function pullContext(tx: Tx, since: string | null, scope: string | null) {
  const visibleRideRows = tx
    .select({ id: rides.id, rideClass: rides.rideClass, createdAt: rides.createdAt })
    .from(rides)
    .where(scope === null ? undefined : eq(rides.operatorCompanyId, scope))
    .all();
  const visible = new Set(visibleRideRows.map((r) => r.id));
  const classes = [...new Set(visibleRideRows.map((r) => r.rideClass))];

  const audit =
    since === null
      ? []
      : tx
          .select({
            entity: auditLog.entity,
            entityId: auditLog.entityId,
            action: auditLog.action,
            rideId: auditLog.rideId,
          })
          .from(auditLog)
          .where(gte(auditLog.at, since))
          .all();
  const audited = (entity: (typeof audit)[number]['entity']) =>
    new Set(audit.filter((a) => a.entity === entity).map((a) => a.entityId));
  return { tx, since, scope, visible, classes, visibleRideRows, audit, audited };
}

type PullContext = ReturnType<typeof pullContext>;

/** Rides and their current design data (and the rides deleted since the cursor). */
function pulledRides({ tx, since, scope, visible, visibleRideRows, audit, audited }: PullContext) {
  let rideIds: string[];
  let designRideIds: string[];
  const removedRides: string[] = [];
  if (since === null) {
    rideIds = [...visible];
    designRideIds = rideIds;
  } else {
    const changed = new Set<string>();
    for (const r of visibleRideRows) if (r.createdAt >= since) changed.add(r.id);
    for (const id of audited('ride')) changed.add(id);
    // Each ride carries its open bulletins: a change to the register may change any ride's, a bulletin
    // recorded done or not done only its ride's.
    if (audited('bulletin').size) for (const r of visibleRideRows) changed.add(r.id);
    for (const id of ridesWithActionsSince(tx, since)) changed.add(id);
    // A renamed site or operator changes the names every ride summary carries.
    const sites = [...audited('site')];
    const companies = [...audited('company')];
    if (sites.length || companies.length) {
      const affected = tx
        .select({ id: rides.id })
        .from(rides)
        .where(
          or(
            sites.length ? inArray(rides.siteId, sites) : undefined,
            companies.length ? inArray(rides.operatorCompanyId, companies) : undefined,
          ),
        )
        .all();
      for (const r of affected) changed.add(r.id);
    }
    rideIds = [...changed].filter((id) => visible.has(id));
    for (const a of audit)
      if (a.entity === 'ride' && a.action === 'delete' && !visible.has(a.entityId))
        removedRides.push(a.entityId);
    const newDesigns = tx
      .select({ rideId: designVersions.rideId })
      .from(designVersions)
      // A revision approved since the cursor was made earlier: its decision is what the phone must see.
      .where(or(gte(designVersions.createdAt, since), gte(designVersions.decidedAt, since)))
      .all()
      .map((d) => d.rideId);
    designRideIds = [...new Set([...rideIds, ...newDesigns])].filter((id) => visible.has(id));
  }
  const rideList = rideIds
    .map((id) => findRide(tx, id, scope))
    .filter((r): r is RideSummary => r !== null)
    .sort((a, b) => a.name.localeCompare(b.name));
  const designs = designRideIds.flatMap((rideId) => {
    const design = findDesignVersion(tx, rideId);
    return design ? [{ ...design, rideId }] : [];
  });
  return { rideList, designs, removedRides };
}

/**
 * Checklist templates for the classes of the caller's rides (and the ones to drop). An operator's phone
 * records daily checks only, so it gets the daily pre-opening templates and no inspector's checklist.
 */
function pulledTemplates(
  { tx, since, classes, audited }: PullContext,
  rideList: RideSummary[],
  dailyOnly: boolean,
) {
  let templateIds: string[];
  const removedTemplates: string[] = [];
  if (since === null) {
    templateIds = classes.flatMap((rideClass) => listChecklistTemplates(tx, { rideClass }).map((t) => t.id));
  } else {
    const changed = audited('checklist_template');
    for (const t of tx
      .select({ id: checklistTemplates.id })
      .from(checklistTemplates)
      .where(gte(checklistTemplates.createdAt, since))
      .all())
      changed.add(t.id);
    for (const v of tx
      .select({ id: checklistTemplateVersions.templateId })
      .from(checklistTemplateVersions)
      .where(gte(checklistTemplateVersions.createdAt, since))
      .all())
      changed.add(v.id);
    for (const t of tx
      .select({ id: checklistTemplates.id })
      .from(checklistTemplates)
      .where(and(isNotNull(checklistTemplates.archivedAt), gte(checklistTemplates.archivedAt, since)))
      .all())
      changed.add(t.id);
    // A ride that is new, or changed class, needs its class's templates even if they did not change.
    const rideClasses = new Set(rideList.map((r) => r.rideClass));
    for (const rideClass of rideClasses)
      for (const t of listChecklistTemplates(tx, { rideClass })) changed.add(t.id);
    templateIds = [...changed];
  }
  const templates = templateIds.flatMap((id) => {
    const template = findChecklistTemplate(tx, id);
    if (!template) return [];
    if (
      template.archivedAt !== null ||
      !classes.includes(template.rideClass) ||
      (dailyOnly && template.inspectionType !== DAILY_CHECK_TYPE)
    ) {
      removedTemplates.push(id);
      return [];
    }
    return [template];
  });
  return { templates, removedTemplates };
}

/** Decisions on the caller's inspections, each with its findings. */
function pulledDecisions({ tx, since, audited }: PullContext, userId: string): Decision[] {
  // A decision is sent again when it, or one of its findings, changed since the cursor. The audit log
  // has every such change (a finding's entry keeps its inspection id, deleted findings included).
  const touched =
    since === null
      ? []
      : [
          ...audited('inspection'),
          ...tx
            .select({
              id: sql<
                string | null
              >`json_extract(coalesce(${auditLog.after}, ${auditLog.before}), '$.inspectionId')`,
            })
            .from(auditLog)
            .where(and(eq(auditLog.entity, 'finding'), gte(auditLog.at, since)))
            .all()
            .flatMap((r) => (r.id ? [r.id] : [])),
        ];
  const decisionRows = tx
    .select({
      inspectionId: inspections.id,
      rideId: inspections.rideId,
      state: inspections.reviewState,
      note: inspections.reviewNote,
      decidedAt: inspections.reviewedAt,
      decidedByName: users.name,
    })
    .from(inspections)
    .leftJoin(users, eq(users.id, inspections.reviewedBy))
    .where(
      and(
        eq(inspections.inspectorId, userId),
        ne(inspections.reviewState, 'submitted'),
        isNotNull(inspections.reviewedAt),
        since === null
          ? undefined
          : or(
              gte(inspections.reviewedAt, since),
              touched.length ? inArray(inspections.id, [...new Set(touched)]) : undefined,
            ),
      ),
    )
    .all()
    .flatMap((d) => (d.decidedAt === null ? [] : [{ ...d, decidedAt: d.decidedAt }]));
  const findingsOf = new Map<string, PulledDecisionFinding[]>();
  if (decisionRows.length)
    for (const { inspectionId, ...f } of tx
      .select({
        inspectionId: findings.inspectionId,
        id: findings.id,
        number: findingNumber,
        severity: findings.severity,
        description: findings.description,
        requiredAction: findings.requiredAction,
        dueOn: findings.dueOn,
        state: findings.state,
      })
      .from(findings)
      // One parameter however many decisions a first pull carries.
      .where(
        sql`${findings.inspectionId} IN (SELECT value FROM json_each(${JSON.stringify(decisionRows.map((d) => d.inspectionId))}))`,
      )
      .orderBy(asc(findings.inspectionId), asc(findings.number))
      .all())
      findingsOf.set(inspectionId, [...(findingsOf.get(inspectionId) ?? []), f]);
  const decisions: Decision[] = decisionRows.map((d) => ({
    ...d,
    findings: findingsOf.get(d.inspectionId) ?? [],
  }));
  return decisions;
}

/**
 * Builds one answer. `readAt` is when the answer is read (the next cursor); `now` is the business date
 * for assignments' due status (pinned in tests); `overlapMs` lets tests see exact deltas. A cursor in the future (the server's clock was set
 * back) is answered like a first pull, since changes stamped before it would otherwise never be sent.
 */
export function buildPull(
  db: Db,
  user: SessionUser,
  cursor: string | null,
  opts: { readAt?: Date; now?: Date; overlapMs?: number } = {},
): PullResponse {
  const readAt = opts.readAt ?? new Date();
  const overlapMs = opts.overlapMs ?? CURSOR_OVERLAP_MS;
  const now = opts.now ?? readAt;
  const cursorAt = cursor === null ? null : parseCursor(cursor);
  const since =
    cursorAt === null || cursorAt.getTime() > readAt.getTime()
      ? null
      : new Date(cursorAt.getTime() - overlapMs).toISOString();
  const scope = companyScope(user);

  // One read transaction, so the answer is a consistent snapshot of the database.
  return db.transaction((tx) => {
    const ctx = pullContext(tx, since, scope);
    const { visible } = ctx;
    const { rideList, designs, removedRides } = pulledRides(ctx);
    const { templates, removedTemplates } = pulledTemplates(ctx, rideList, user.role === 'operator');

    // ——— assignments: always the whole (short) list, since due status moves with the date alone ———
    // `db`, not `tx`: the registry's function takes the database type; on this one connection it reads
    // inside the same transaction all the same.
    const assignments = assignmentsOf(db, user.id, now).filter((a) => visible.has(a.rideId));
    const mine = new Set(assignments.map((a) => a.id));
    const removedAssignments = [...ctx.audited('schedule')].filter((id) => !mine.has(id));

    const decisions = pulledDecisions(ctx, user.id);

    // ——— the instrument register and the declaration text: always whole (both are short), so the phone
    // replaces its copy and never keeps an instrument the register has dropped ———
    const instrumentList = listInstruments(tx);
    const declaration = getDeclarationSetting(tx);

    const removed = {
      ...(removedRides.length ? { rides: removedRides } : {}),
      ...(removedAssignments.length ? { assignments: removedAssignments } : {}),
      ...(removedTemplates.length ? { templates: removedTemplates } : {}),
    };
    const openBulletins = openBulletinsOf(
      tx,
      rideList.map((r) => r.id),
    );
    return {
      cursor: cursorOf(readAt),
      rides: rideList.map((r) => ({ ...r, openBulletins: openBulletins.get(r.id) ?? [] })),
      designs,
      templates,
      assignments,
      decisions,
      instruments: instrumentList,
      declaration,
      ...(Object.keys(removed).length ? { removed } : {}),
      hasMore: false,
    };
  });
}
