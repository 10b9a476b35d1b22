/**
 * The demo's daily pre-opening checks: for each demo ride, a check on every day of the last fortnight
 * its running log shows it ran, made by its operator company's demo user at 08:15 on the site's clock,
 * all passed, two empty test cycles each. One day is left without a check, so the demo shows a missed
 * day: Tidebreaker's latest day run. Invented; pushed like a phone's (signed, through the push's own
 * checks), with fixed ids so a second run adds nothing.
 */
import { and, eq, gte, lt } from 'drizzle-orm';

import { runningLog } from '@/db/server/life';
import { inspections } from '@/db/server/inspections';
import { companies, rides, users } from '@/db/server/schema';
import { DAILY_CHECK_TYPE, MISSED_WINDOW_DAYS } from '@/features/daily-checks/schema';
import { DEFAULT_DECLARATION_TEXT } from '@/features/instruments/schema';
import { keyIdOf, newPrivateKey, publicKeyOf } from '@/features/ledger';
import type { InspectionRecord } from '@/features/records/schema';
import { pickChecklistTemplate } from '@/features/registry/schema';
import { addDays, dayInZone, startOfDayInZone } from '@/lib/dates';
import { registerDeviceKey } from '@/server/auth/device-keys';
import { findSessionUser } from '@/server/auth/service';
import type { Db } from '@/server/db';
import { findChecklistTemplate, listChecklistTemplates } from '@/server/registry/checklists';
import { rideTimeZone } from '@/server/schedule-due';
import { demoUuid } from '@/server/seed/demo-ids';
import { analyseOne } from '@/server/sync/analysis';
import { ingestBatch } from '@/server/sync/ingest';

/** The ride left with a missed day, by serial (Tidebreaker). */
const MISSED_SERIAL = 'ORW-RX30-0158';

export function addDemoDailyChecks(db: Db, now: Date): number {
  let added = 0;
  const operators = db
    .select({ id: users.id, companyId: users.companyId })
    .from(users)
    .where(eq(users.role, 'operator'))
    .all();
  for (const op of operators) {
    const person = findSessionUser(db, op.id);
    if (!person || !op.companyId) continue;
    const company = db
      .select({ id: companies.id })
      .from(companies)
      .where(eq(companies.id, op.companyId))
      .get();
    if (!company) continue;
    const records = db
      .select({ id: rides.id, name: rides.name, rideClass: rides.rideClass, serial: rides.serial })
      .from(rides)
      .where(eq(rides.operatorCompanyId, company.id))
      .all()
      .flatMap((ride) => recordsOfRide(db, ride, person.id, person.name, now));
    const fresh = records.filter(
      (r) => !db.select({ id: inspections.id }).from(inspections).where(eq(inspections.id, r.id)).get(),
    );
    if (fresh.length === 0) continue;
    // The operator's demo phone, registered when its first check was made.
    const privateKey = newPrivateKey();
    const publicKey = publicKeyOf(privateKey);
    registerDeviceKey(db, person, { publicKey, label: 'Demo operator phone' }, new Date(fresh[0].startedAt));
    const outcome = ingestBatch(
      db,
      person,
      { batchId: demoUuid(`daily:${op.id}:${fresh[0].id}`), records: fresh },
      now,
      { signWith: { keyId: keyIdOf(publicKey), privateKey } },
    );
    for (const result of outcome.result.results) {
      if (result.status !== 'accepted' || !result.id)
        throw new Error(`demo daily check refused: ${JSON.stringify(result.issues)}`);
      analyseOne(db, result.id, now);
      added++;
    }
  }
  return added;
}

function recordsOfRide(
  db: Db,
  ride: { id: string; name: string; rideClass: string; serial: string | null },
  authorId: string,
  authorName: string,
  now: Date,
): InspectionRecord[] {
  const summary = pickChecklistTemplate(
    listChecklistTemplates(db, { inspectionType: DAILY_CHECK_TYPE }),
    ride.rideClass,
    DAILY_CHECK_TYPE,
  ).template;
  const template = summary ? findChecklistTemplate(db, summary.id) : null;
  if (!template) return [];
  const zone = rideTimeZone(db, ride.id);
  const today = dayInZone(now, zone);
  const ran = db
    .select({ day: runningLog.day, cycles: runningLog.cycles, hours: runningLog.hours })
    .from(runningLog)
    .where(
      and(
        eq(runningLog.rideId, ride.id),
        gte(runningLog.day, addDays(today, -MISSED_WINDOW_DAYS)),
        lt(runningLog.day, today),
      ),
    )
    .all()
    .filter((r) => (r.cycles ?? 0) > 0 || (r.hours ?? 0) > 0)
    .map((r) => r.day)
    .sort();
  const days = ride.serial === MISSED_SERIAL ? ran.slice(0, -1) : ran;
  return days.map((day) => {
    const submittedAt = new Date(
      startOfDayInZone(day, zone).getTime() + (8 * 60 + 15) * 60_000,
    ).toISOString();
    const startedAt = new Date(Date.parse(submittedAt) - 20 * 60_000).toISOString();
    return {
      id: demoUuid(`daily:${ride.id}:${day}`),
      rideId: ride.id,
      designVersionId: null,
      templateId: template.id,
      templateVersion: template.version.version,
      type: DAILY_CHECK_TYPE,
      authorId,
      startedAt,
      submittedAt,
      checklist: template.version.content.areas.flatMap((area) =>
        area.items.map((item) => ({
          itemId: item.id,
          area: area.title,
          text: item.text,
          result: 'pass' as const,
          ...(item.measurementRequired
            ? { measurement: { valueSI: 4, unit: item.measurementLabel ?? '', entered: '4' } }
            : {}),
        })),
      ),
      readings: [],
      photos: [],
      preview: null,
      amendsId: null,
      declaration: {
        text: DEFAULT_DECLARATION_TEXT,
        declaredAt: submittedAt,
        declaredBy: authorId,
        declaredByName: authorName,
      },
      testRuns: [{ cycles: 2, result: 'pass' }],
    };
  });
}
