/**
 * The server's half of the checklist limits (features/inspections/checklist-limits.ts): a record that
 * marks Pass on a value over its limit without the inspector's written reason is refused, with an issue
 * naming the answer's field. The phone asks for the reason before it lets such an answer stand, so only
 * an old or altered app sends one. Limits come from the template version and design data the record names.
 */
import type Database from 'better-sqlite3';
import { and, eq } from 'drizzle-orm';

import { checklistTemplateVersions } from '@/db/server/schema';
import { passedOverLimitWithoutReason } from '@/features/records/checklist-limits';
import type { ChecklistAnswer } from '@/features/records/schema';
import type { DesignData } from '@/features/loads/design-schema';
import { type ChecklistContent, storedChecklistContentSchema } from '@/features/registry/schema';
import { formatAgainstLimit } from '@/lib/measured-format';
import type { Db } from '@/server/db';
import { designDataLookup } from '@/server/sync/plausibility-check';

type Issue = { path: string; message: string };

const parseContent = (raw: unknown): ChecklistContent | null => {
  const parsed = storedChecklistContentSchema.safeParse(raw);
  return parsed.success ? parsed.data : null;
};

/** Prepared once per connection: a push asks for them batch after batch. */
const contentStatements = new WeakMap<
  Database.Database,
  Database.Statement<[string, number], { content: string }>
>();

/** Template content by id and version, read once per batch; null when there is none (or it is unreadable). */
function templateContentLookup(
  sqlite: Database.Database,
): (templateId: string | null, version: number | null) => ChecklistContent | null {
  let prepared = contentStatements.get(sqlite);
  if (!prepared) {
    prepared = sqlite.prepare<[string, number], { content: string }>(
      'SELECT content FROM checklist_template_versions WHERE template_id = ? AND version = ?',
    );
    contentStatements.set(sqlite, prepared);
  }
  const stmt = prepared;
  const seen = new Map<string, ChecklistContent | null>();
  return (templateId, version) => {
    if (templateId === null || version === null) return null;
    const key = `${templateId}@${version}`;
    let content = seen.get(key);
    if (content === undefined) {
      const row = stmt.get(templateId, version);
      content = row ? parseContent(JSON.parse(row.content)) : null;
      seen.set(key, content);
    }
    return content;
  };
}

/** The template version an inspection was filled against, for its analysis. */
export function templateContentOf(
  db: Pick<Db, 'select'>,
  templateId: string | null,
  version: number | null,
): ChecklistContent | null {
  if (templateId === null || version === null) return null;
  const row = db
    .select({ content: checklistTemplateVersions.content })
    .from(checklistTemplateVersions)
    .where(
      and(
        eq(checklistTemplateVersions.templateId, templateId),
        eq(checklistTemplateVersions.version, version),
      ),
    )
    .get();
  return row ? parseContent(row.content) : null;
}

/**
 * What the ingest check reads, once per batch: template versions and design versions by id (`design`: the
 * batch's own design lookup when it has one, so each version is read once per batch).
 */
export function checklistLimitLookup(
  sqlite: Database.Database,
  design: (id: string) => DesignData | null = designDataLookup(sqlite),
) {
  return { template: templateContentLookup(sqlite), design };
}

/** Issues for each answer passed over its limit without a reason. */
export function checklistLimitIssues(
  design: DesignData | null,
  content: ChecklistContent | null,
  checklist: readonly ChecklistAnswer[],
): Issue[] {
  return passedOverLimitWithoutReason(design, content, checklist).map(({ index, evaluation, resolved }) => {
    const m = checklist[index].measurement;
    const shown =
      evaluation && resolved
        ? formatAgainstLimit(evaluation.value, resolved.limit, resolved.quantity, 'si', {
            entered: m?.entered,
            unit: m?.unit,
          })
        : null;
    const against = shown
      ? `${shown.value} against ${shown.limit} (${resolved?.source})`
      : 'the phone found this value over its limit';
    return {
      path: `checklist.${index}.overLimitReason`,
      message: `Over its limit: ${against}. A value over its limit can be marked Pass only with the inspector's written reason`,
    };
  });
}
