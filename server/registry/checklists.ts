import { randomUUID } from 'node:crypto';

import { and, asc, desc, eq, isNull, ne, sql } from 'drizzle-orm';
import type { z } from 'zod';

import { checklistTemplates, checklistTemplateVersions, users } from '@/db/server/schema';
import type {
  ChecklistContent,
  ChecklistTemplate,
  ChecklistTemplateSummary,
  checklistContentSchema,
  InspectionType,
} from '@/features/registry/schema';
import { inspectionTypeLabel } from '@/features/registry/schema';
import { rideClassLabel, type RideClass } from '@/features/rides/schema';
import type { Db } from '@/server/db';
import { conflict, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';

type ContentInput = z.output<typeof checklistContentSchema>;

/** Gives every new area and item an id (kept by later versions) and fills the optional fields. */
function normaliseChecklist(content: ContentInput): ChecklistContent {
  const taken = new Set<string>();
  content.areas.forEach((a) => {
    if (a.id) taken.add(a.id);
    a.items.forEach((i) => i.id && taken.add(i.id));
  });
  const fresh = (prefix: string) => {
    let id: string;
    do id = `${prefix}-${randomUUID().slice(0, 8)}`;
    while (taken.has(id));
    taken.add(id);
    return id;
  };
  return {
    areas: content.areas.map((area) => ({
      id: area.id ?? fresh('area'),
      title: area.title,
      items: area.items.map((item) => ({
        id: item.id ?? fresh('item'),
        text: item.text,
        guidance: item.guidance ?? null,
        photoRequired: item.photoRequired,
        measurementRequired: item.measurementRequired,
        measurementKind: item.measurementKind ?? null,
        measurementLabel: item.measurementLabel ?? null,
        limit: item.limit ?? null,
      })),
    })),
  };
}

const latestVersion = sql`(SELECT max(v2."version") FROM "checklist_template_versions" v2 WHERE v2."template_id" = "checklist_templates"."id")`;

function templateRows(db: Pick<Db, 'select'>) {
  return db
    .select({
      id: checklistTemplates.id,
      name: checklistTemplates.name,
      rideClass: checklistTemplates.rideClass,
      inspectionType: checklistTemplates.inspectionType,
      createdAt: checklistTemplates.createdAt,
      archivedAt: checklistTemplates.archivedAt,
      version: checklistTemplateVersions.version,
      versionCreatedAt: checklistTemplateVersions.createdAt,
      createdByName: users.name,
      reason: checklistTemplateVersions.reason,
      content: checklistTemplateVersions.content,
    })
    .from(checklistTemplates)
    .innerJoin(
      checklistTemplateVersions,
      and(
        eq(checklistTemplateVersions.templateId, checklistTemplates.id),
        eq(checklistTemplateVersions.version, latestVersion),
      ),
    )
    .innerJoin(users, eq(users.id, checklistTemplateVersions.createdBy));
}

type Row = ReturnType<ReturnType<typeof templateRows>['all']>[number];

function summaryOf(row: Row): ChecklistTemplateSummary {
  return {
    id: row.id,
    name: row.name,
    rideClass: row.rideClass,
    inspectionType: row.inspectionType ?? null,
    createdAt: row.createdAt,
    archivedAt: row.archivedAt,
    currentVersion: row.version,
    updatedAt: row.versionCreatedAt,
    updatedByName: row.createdByName,
    areaCount: row.content.areas.length,
    itemCount: row.content.areas.reduce((n, a) => n + a.items.length, 0),
  };
}

export function listChecklistTemplates(
  db: Pick<Db, 'select'>,
  filter: { rideClass?: RideClass; inspectionType?: InspectionType | 'general'; includeArchived?: boolean },
): ChecklistTemplateSummary[] {
  return templateRows(db)
    .where(
      and(
        filter.rideClass ? eq(checklistTemplates.rideClass, filter.rideClass) : undefined,
        filter.inspectionType === 'general'
          ? isNull(checklistTemplates.inspectionType)
          : filter.inspectionType
            ? eq(checklistTemplates.inspectionType, filter.inspectionType)
            : undefined,
        filter.includeArchived ? undefined : isNull(checklistTemplates.archivedAt),
      ),
    )
    .orderBy(asc(checklistTemplates.rideClass), asc(checklistTemplates.name), asc(checklistTemplates.id))
    .all()
    .map(summaryOf);
}

/** A template with its current version, or with `version` when given. */
export function findChecklistTemplate(
  db: Pick<Db, 'select'>,
  id: string,
  version?: number,
): ChecklistTemplate | null {
  const current = templateRows(db).where(eq(checklistTemplates.id, id)).get();
  if (!current) return null;
  const at =
    version === undefined
      ? {
          version: current.version,
          createdAt: current.versionCreatedAt,
          createdByName: current.createdByName,
          reason: current.reason,
          content: current.content,
        }
      : db
          .select({
            version: checklistTemplateVersions.version,
            createdAt: checklistTemplateVersions.createdAt,
            createdByName: users.name,
            reason: checklistTemplateVersions.reason,
            content: checklistTemplateVersions.content,
          })
          .from(checklistTemplateVersions)
          .innerJoin(users, eq(users.id, checklistTemplateVersions.createdBy))
          .where(
            and(eq(checklistTemplateVersions.templateId, id), eq(checklistTemplateVersions.version, version)),
          )
          .get();
  if (!at) return null;
  return { ...summaryOf(current), version: at };
}

export function mustFindChecklistTemplate(
  db: Pick<Db, 'select'>,
  id: string,
  version?: number,
): ChecklistTemplate {
  const found = findChecklistTemplate(db, id, version);
  if (!found)
    throw notFound(
      version === undefined
        ? 'No such checklist template.'
        : `No version ${version} of this checklist template.`,
    );
  return found;
}

export function listChecklistVersions(db: Pick<Db, 'select'>, id: string) {
  mustFindChecklistTemplate(db, id);
  return db
    .select({
      version: checklistTemplateVersions.version,
      createdAt: checklistTemplateVersions.createdAt,
      createdByName: users.name,
      reason: checklistTemplateVersions.reason,
    })
    .from(checklistTemplateVersions)
    .innerJoin(users, eq(users.id, checklistTemplateVersions.createdBy))
    .where(eq(checklistTemplateVersions.templateId, id))
    .orderBy(desc(checklistTemplateVersions.version))
    .all();
}

type NewTemplate = {
  name: string;
  rideClass: RideClass;
  inspectionType?: InspectionType | null;
  content: ContentInput;
  reason?: string;
};

/**
 * One template in use per ride class and inspection type, so the phone's pick is never a guess; general
 * templates (no type) may be several, as before types existed.
 */
function refuseSecondOfType(
  db: Pick<Db, 'select'>,
  rideClass: RideClass,
  type: InspectionType | null,
  exceptId: string | null,
): void {
  if (type === null) return;
  const other = db
    .select({ id: checklistTemplates.id, name: checklistTemplates.name })
    .from(checklistTemplates)
    .where(
      and(
        eq(checklistTemplates.rideClass, rideClass),
        eq(checklistTemplates.inspectionType, type),
        isNull(checklistTemplates.archivedAt),
        exceptId ? ne(checklistTemplates.id, exceptId) : undefined,
      ),
    )
    .get();
  if (other)
    throw conflict(
      `${other.name} is already the ${rideClassLabel[rideClass].toLowerCase()} checklist for ` +
        `${inspectionTypeLabel[type].toLowerCase()} inspections; change that one, or archive it first.`,
      'template_exists',
    );
}

export function createChecklistTemplate(
  db: Pick<Db, 'transaction'>,
  userId: string,
  input: NewTemplate,
  audit = true,
): ChecklistTemplate {
  return db.transaction((tx) => {
    const inspectionType = input.inspectionType ?? null;
    refuseSecondOfType(tx, input.rideClass, inspectionType, null);
    const { id } = tx
      .insert(checklistTemplates)
      .values({ name: input.name, rideClass: input.rideClass, inspectionType })
      .returning({ id: checklistTemplates.id })
      .get();
    tx.insert(checklistTemplateVersions)
      .values({
        templateId: id,
        version: 1,
        content: normaliseChecklist(input.content),
        reason: input.reason ?? 'New template',
        createdBy: userId,
      })
      .run();
    const template = mustFindChecklistTemplate(tx, id);
    if (audit)
      recordAudit(tx, {
        userId,
        entity: 'checklist_template',
        entityId: id,
        action: 'create',
        summary: `Checklist template ${template.name} added`,
        after: template,
      });
    return template;
  });
}

type TemplateChange = {
  name?: string;
  inspectionType?: InspectionType | null;
  content: ContentInput;
  reason: string;
  basedOnVersion?: number;
};

/** A new version of the template's content (and optionally a new name); the old versions stay. */
export function updateChecklistTemplate(
  db: Db,
  userId: string,
  id: string,
  change: TemplateChange,
): ChecklistTemplate {
  return db.transaction((tx) => {
    const before = mustFindChecklistTemplate(tx, id);
    if (before.archivedAt !== null)
      throw conflict('This template is archived; make a new one instead.', 'archived');
    if (change.basedOnVersion !== undefined && change.basedOnVersion !== before.currentVersion)
      throw conflict(
        `The template changed while you were editing: version ${before.currentVersion} is now current, your ` +
          `change was made from version ${change.basedOnVersion}. Nothing was saved.`,
        'version_conflict',
      );
    if (change.name !== undefined && change.name !== before.name)
      tx.update(checklistTemplates).set({ name: change.name }).where(eq(checklistTemplates.id, id)).run();
    if (change.inspectionType !== undefined && change.inspectionType !== before.inspectionType) {
      refuseSecondOfType(tx, before.rideClass, change.inspectionType, id);
      tx.update(checklistTemplates)
        .set({ inspectionType: change.inspectionType })
        .where(eq(checklistTemplates.id, id))
        .run();
    }
    tx.insert(checklistTemplateVersions)
      .values({
        templateId: id,
        version: before.currentVersion + 1,
        content: normaliseChecklist(change.content),
        reason: change.reason,
        createdBy: userId,
      })
      .run();
    const after = mustFindChecklistTemplate(tx, id);
    recordAudit(tx, {
      userId,
      entity: 'checklist_template',
      entityId: id,
      action: 'update',
      summary: `Checklist template ${after.name}: version ${after.currentVersion} — ${change.reason}`,
      before,
      after,
    });
    return after;
  });
}

/** "Deleting" archives: inspections made against the template must still show it. */
export function archiveChecklistTemplate(db: Db, userId: string, id: string, now: Date): void {
  db.transaction((tx) => {
    const before = mustFindChecklistTemplate(tx, id);
    if (before.archivedAt !== null) return;
    tx.update(checklistTemplates)
      .set({ archivedAt: now.toISOString() })
      .where(eq(checklistTemplates.id, id))
      .run();
    recordAudit(tx, {
      userId,
      entity: 'checklist_template',
      entityId: id,
      action: 'delete',
      summary: `Checklist template ${before.name} archived`,
      before,
      after: mustFindChecklistTemplate(tx, id),
    });
  });
}
