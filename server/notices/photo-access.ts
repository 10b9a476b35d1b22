import { sql } from 'drizzle-orm';

import { photos } from '@/db/server/inspections';
import { correctiveActions, noticeFindings, notices } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { users } from '@/db/server/schema';
import type { Db } from '@/server/db';

/**
 * Whether an operator of `companyId` may see a photo: one shown on a notice to the company (as issued, or
 * on the notice's findings as they are now), one attached to a corrective action on those findings or
 * taken by the verifier on closing one, or one uploaded by someone of the company (their own evidence,
 * before they report it).
 */
export function operatorMaySeePhoto(db: Pick<Db, 'get'>, companyId: string, sha256: string): boolean {
  const row = db.get<{ ok: number } | undefined>(
    sql`SELECT 1 AS ok WHERE EXISTS (
          SELECT 1 FROM ${notices} n, json_each(n.document, '$.findings') f, json_each(f.value, '$.photos') p
          WHERE n.operator_company_id = ${companyId} AND json_extract(p.value, '$.sha256') = ${sha256})
        OR EXISTS (
          SELECT 1 FROM ${notices} n JOIN ${noticeFindings} nf ON nf.notice_id = n.id
            JOIN ${findings} fi ON fi.id = nf.finding_id, json_each(fi.photo_shas) p
          WHERE n.operator_company_id = ${companyId} AND p.value = ${sha256})
        OR EXISTS (
          SELECT 1 FROM ${notices} n JOIN ${noticeFindings} nf ON nf.notice_id = n.id
            JOIN ${correctiveActions} ca ON ca.finding_id = nf.finding_id, json_each(ca.photo_shas) p
          WHERE n.operator_company_id = ${companyId} AND p.value = ${sha256})
        OR EXISTS (
          SELECT 1 FROM ${notices} n JOIN ${noticeFindings} nf ON nf.notice_id = n.id
            JOIN ${findings} fi ON fi.id = nf.finding_id, json_each(fi.close_evidence, '$.photoShas') p
          WHERE n.operator_company_id = ${companyId} AND p.value = ${sha256})
        OR EXISTS (
          SELECT 1 FROM ${photos} ph JOIN ${users} u ON u.id = ph.uploaded_by
          WHERE ph.sha256 = ${sha256} AND u.company_id = ${companyId})`,
  );
  return row !== undefined;
}
