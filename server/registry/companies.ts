import { and, asc, count, eq, or, sql } from 'drizzle-orm';

import { companies, rides, users } from '@/db/server/schema';
import type { Company, CompanyInput } from '@/features/registry/schema';
import { companyListQuerySchema, companyPatchSchema } from '@/features/registry/schema';
import type { Db } from '@/server/db';
import { conflict, HttpError, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { contains, offsetOf, orderBy } from '@/server/registry/query';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import type { z } from 'zod';

type ListQuery = z.output<typeof companyListQuerySchema>;
type Patch = z.output<typeof companyPatchSchema>;

const companyColumns = {
  id: companies.id,
  kind: companies.kind,
  name: companies.name,
  noticeEmails: companies.noticeEmails,
  phone: companies.phone,
  address: companies.address,
  contacts: companies.contacts,
  noticeUnits: companies.noticeUnits,
  noticePaper: companies.noticePaper,
  createdAt: companies.createdAt,
  // Written out in full: drizzle drops the table name from columns inside a select's sql, which would
  // make these compare the subquery's own columns.
  siteCount: sql<number>`(SELECT count(*) FROM "sites" s WHERE s."operator_company_id" = "companies"."id")`,
  rideCount: sql<number>`(SELECT count(*) FROM "rides" r WHERE r."operator_company_id" = "companies"."id")`,
};

/** Contacts as stored, with every optional field present (null when not given). */
function normaliseContacts(contacts: CompanyInput['contacts']): Company['contacts'] {
  return (contacts ?? []).map((c) => ({
    name: c.name,
    role: c.role ?? null,
    email: c.email ?? null,
    phone: c.phone ?? null,
  }));
}

/** The register is about ride owners: the inspection body's own company record is not part of it. */
const isOperator = eq(companies.kind, 'operator');

export function listCompanies(db: Db, query: ListQuery) {
  const where = and(
    isOperator,
    query.q
      ? or(
          contains(companies.name, query.q),
          contains(companies.phone, query.q),
          contains(sql`${companies.noticeEmails}`, query.q),
        )
      : undefined,
  );
  const total = db.select({ n: count() }).from(companies).where(where).get()?.n ?? 0;
  const rows = db
    .select(companyColumns)
    .from(companies)
    .where(where)
    .orderBy(
      ...orderBy(
        query.sort,
        { name: companies.name, createdAt: companies.createdAt },
        [asc(companies.name)],
        [companies.id],
      ),
    )
    .limit(query.pageSize)
    .offset(offsetOf(query))
    .all();
  return { companies: rows, total, page: query.page, pageSize: query.pageSize };
}

export function findCompany(db: Pick<Db, 'select'>, id: string): Company | null {
  return (
    db
      .select(companyColumns)
      .from(companies)
      .where(and(eq(companies.id, id), isOperator))
      .get() ?? null
  );
}

function mustFindCompany(db: Pick<Db, 'select'>, id: string): Company {
  const company = findCompany(db, id);
  if (!company) throw notFound('No such operator company.');
  return company;
}

export function createCompany(db: Db, userId: string, input: CompanyInput): Company {
  return db.transaction((tx) => {
    const { id } = tx
      .insert(companies)
      .values({
        kind: 'operator',
        name: input.name,
        noticeEmails: input.noticeEmails ?? [],
        phone: input.phone ?? null,
        address: input.address ?? null,
        contacts: normaliseContacts(input.contacts),
        noticeUnits: input.noticeUnits ?? 'si',
        noticePaper: input.noticePaper ?? 'A4',
      })
      .returning({ id: companies.id })
      .get();
    const company = mustFindCompany(tx, id);
    recordAudit(tx, {
      userId,
      entity: 'company',
      entityId: id,
      action: 'create',
      summary: `Operator company ${company.name} added`,
      after: company,
    });
    return company;
  });
}

export function updateCompany(db: Db, userId: string, id: string, patch: Patch): Company {
  return db.transaction((tx) => {
    const before = mustFindCompany(tx, id);
    tx.update(companies)
      .set({
        ...(patch.name !== undefined && { name: patch.name }),
        ...(patch.noticeEmails !== undefined && { noticeEmails: patch.noticeEmails }),
        ...(patch.phone !== undefined && { phone: patch.phone }),
        ...(patch.address !== undefined && { address: patch.address }),
        ...(patch.contacts !== undefined && { contacts: normaliseContacts(patch.contacts) }),
        // Notices already issued keep the units and paper they were issued with (frozen in their document).
        ...(patch.noticeUnits !== undefined && { noticeUnits: patch.noticeUnits }),
        ...(patch.noticePaper !== undefined && { noticePaper: patch.noticePaper }),
      })
      .where(eq(companies.id, id))
      .run();
    const after = mustFindCompany(tx, id);
    recordAudit(tx, {
      userId,
      entity: 'company',
      entityId: id,
      action: 'update',
      summary: `Operator company ${after.name} changed`,
      before,
      after,
    });
    // The review queue shows (and searches) the operator's name on each of its rides' items.
    if (after.name !== before.name) {
      const rideIds = tx
        .select({ id: rides.id })
        .from(rides)
        .where(eq(rides.operatorCompanyId, id))
        .all()
        .map((r) => r.id);
      refreshQueue(tx, queueDay(db), rideIds);
    }
    return after;
  });
}

/**
 * Only a company with nothing attached can go: its sites, rides and users would otherwise lose their
 * owner. The answer says what is still attached.
 */
export function deleteCompany(db: Db, userId: string, id: string): void {
  db.transaction((tx) => {
    const before = mustFindCompany(tx, id);
    const people = tx.select({ n: count() }).from(users).where(eq(users.companyId, id)).get()?.n ?? 0;
    const attached = [
      before.rideCount && `${before.rideCount} ride(s)`,
      before.siteCount && `${before.siteCount} site(s)`,
      people && `${people} user account(s)`,
    ].filter(Boolean);
    if (attached.length > 0)
      throw conflict(`${before.name} still has ${attached.join(', ')}. Move or remove them first.`, 'in_use');
    tx.delete(companies).where(eq(companies.id, id)).run();
    recordAudit(tx, {
      userId,
      entity: 'company',
      entityId: id,
      action: 'delete',
      summary: `Operator company ${before.name} removed`,
      before,
    });
  });
}

/** 400 naming `field` unless `id` is an operator company. */
export function assertOperatorCompany(db: Pick<Db, 'select'>, id: string, field = 'operatorCompanyId'): void {
  const row = db.select({ kind: companies.kind }).from(companies).where(eq(companies.id, id)).get();
  if (row?.kind !== 'operator')
    throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
      { path: field, message: 'No operator company with this id' },
    ]);
}
