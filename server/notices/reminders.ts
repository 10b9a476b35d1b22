/**
 * Reminders to operators about findings coming due: a daily job e-mails each operator company one message
 * listing its open findings due within the next week (`due_soon`) and those past their due date
 * (`past_due`). Each finding gets each stage once, ever: the stage is recorded in `finding_reminders` in
 * the same transaction that queues the e-mail (through the notice deliveries, so retries and the
 * idempotency key work the same way). A finding already past due when first seen gets only `past_due`.
 *
 * Only findings the operator was told about (listed on a notice) and still `open` are included: one with
 * a corrective action reported is waiting for the inspection body, not for the operator. *
 * The same message lists the company's planned NDT coming due within 30 days or overdue, each stage once
 * per due date (server/notices/ndt-reminders.ts).
 */
import { createHash } from 'node:crypto';

import { Cron } from 'croner';
import { and, asc, eq, inArray, isNotNull, sql } from 'drizzle-orm';

import {
  findingReminders,
  noticeDeliveries,
  noticeFindings,
  notices,
  type ReminderStage,
} from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { companies, rides, sites } from '@/db/server/schema';
import { type FindingSeverity } from '@/features/review/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import { appLink, noticePath } from '@/lib/paths';
import type { Db } from '@/server/db';
import type { Logger } from '@/server/logger';
import { deliveriesQueued } from '@/server/notices/nudge';
import { addDays, dayInZone, daysBetween, formatCalendarDate, hourInZone } from '@/lib/dates';
import { siteZoneSql } from '@/server/schedule-due';
import { escapeHtml, htmlMailStart } from '@/server/notices/words';
import { findingNumber } from '@/server/findings/findings';
import {
  dueNdtTests,
  ndtReminderSections,
  recordNdtReminders,
  type NdtReminderItem,
} from '@/server/notices/ndt-reminders';

/** How far ahead a due date counts as "due soon". */
const dueSoonDays = 7;

/** The hour on each site's clock from which its reminders go out (07:00 local). */
export const REMINDER_HOUR = 7;

type ReminderDeps = { db: Db; appUrl: string; logger?: Logger };

type ReminderRun = {
  /** Operator companies e-mailed. */
  companies: number;
  /** Finding × stage pairs recorded. */
  reminded: { findingId: string; stage: ReminderStage }[];
  /** Companies with findings to remind about but no notice address (nothing recorded, so they get it later). */
  noAddress: string[];
  /** Planned NDT × due date × stage recorded (server/notices/ndt-reminders.ts). */
  ndt: { rideId: string; joint: number; method: string; dueOn: string; stage: ReminderStage }[];
};

const shortHash = (text: string) => createHash('sha256').update(text).digest('hex').slice(0, 24);

type Due = {
  findingId: string;
  number: number;
  severity: FindingSeverity;
  description: string;
  requiredAction: string | null;
  dueOn: string;
  rideName: string;
  companyId: string;
  companyName: string;
  noticeEmails: string[];
  noticeId: string;
  noticeReference: string;
  stage: ReminderStage;
};

function dueFindings(db: Pick<Db, 'select'>, today: string, rideIds: readonly string[]): Due[] {
  const soon = addDays(today, dueSoonDays);
  // The latest notice listing the finding: its link is where the operator reports the action.
  const latestNotice = sql<string>`(SELECT n.id FROM ${noticeFindings} nf JOIN ${notices} n ON n.id = nf.notice_id
    WHERE nf.finding_id = ${findings.id} ORDER BY n.issued_at DESC, n.seq DESC LIMIT 1)`;
  const rows = db
    .select({
      findingId: findings.id,
      number: findingNumber,
      severity: findings.severity,
      description: findings.description,
      requiredAction: findings.requiredAction,
      dueOn: findings.dueOn,
      rideName: rides.name,
      companyId: companies.id,
      companyName: companies.name,
      noticeEmails: companies.noticeEmails,
      noticeId: latestNotice,
      pastDueSent: sql<number>`EXISTS (SELECT 1 FROM ${findingReminders} fr
        WHERE fr.finding_id = ${findings.id} AND fr.stage = 'past_due')`,
      dueSoonSent: sql<number>`EXISTS (SELECT 1 FROM ${findingReminders} fr
        WHERE fr.finding_id = ${findings.id} AND fr.stage = 'due_soon')`,
    })
    .from(findings)
    .innerJoin(rides, eq(rides.id, findings.rideId))
    .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
    .where(
      and(
        eq(findings.state, 'open'),
        isNotNull(findings.dueOn),
        sql`${findings.dueOn} <= ${soon}`,
        inArray(findings.rideId, [...rideIds]),
        sql`EXISTS (SELECT 1 FROM ${noticeFindings} nf WHERE nf.finding_id = ${findings.id})`,
      ),
    )
    .orderBy(asc(companies.name), asc(findings.dueOn), asc(rides.name), asc(findings.number))
    .all();
  const references = new Map(
    db
      .select({ id: notices.id, reference: notices.reference })
      .from(notices)
      .where(
        sql`${notices.id} IN (SELECT value FROM json_each(${JSON.stringify(rows.map((r) => r.noticeId))}))`,
      )
      .all()
      .map((n) => [n.id, n.reference]),
  );
  return rows.flatMap((r) => {
    const dueOn = r.dueOn ?? today;
    const stage: ReminderStage = dueOn < today ? 'past_due' : 'due_soon';
    if (stage === 'past_due' ? r.pastDueSent : r.dueSoonSent || r.pastDueSent) return [];
    const { pastDueSent: _p, dueSoonSent: _d, ...rest } = r;
    return [{ ...rest, dueOn, stage, noticeReference: references.get(r.noticeId) ?? '' }];
  });
}

function when(dueOn: string, today: string): string {
  const days = daysBetween(today, dueOn);
  if (days < 0) return `${-days} day${days === -1 ? '' : 's'} past due`;
  if (days === 0) return 'due today';
  return `due in ${days} day${days === 1 ? '' : 's'}`;
}

type NdtSections = ReturnType<typeof ndtReminderSections>;

/** The reminder e-mail for one company: its findings, and its planned NDT coming or past due. */
function reminderEmail(companyName: string, items: Due[], today: string, appUrl: string, ndt: NdtSections) {
  const past = items.filter((i) => i.stage === 'past_due');
  const soon = items.filter((i) => i.stage === 'due_soon');
  const counts = [
    past.length ? `${past.length} past due` : null,
    soon.length ? `${soon.length} due within ${dueSoonDays} days` : null,
  ].filter(Boolean);
  const subject = `Reminder: ${[counts.length ? `findings ${counts.join(', ')}` : null, ndt.subject]
    .filter(Boolean)
    .join(' · ')} · ${companyName}`;
  const link = (i: Due) => appLink(appUrl, noticePath(i.noticeId));
  const line = (i: Due) =>
    `- ${i.rideName}, finding ${i.number} [${severityInfo[i.severity].label}]: ${i.description}\n` +
    (i.requiredAction ? `  Required action: ${i.requiredAction}\n` : '') +
    `  Due ${formatCalendarDate(i.dueOn)} (${when(i.dueOn, today)}) · notice ${i.noticeReference}: ${link(i)}`;
  const section = (title: string, list: Due[]) => (list.length ? [title, ...list.map(line), ''] : []);
  const findingsText = items.length
    ? [
        'These findings from notices issued to you are still open. Report what you have done about each one ' +
          'with the link beside it; the inspection body then verifies and closes it.',
        '',
        ...section('Past due:', past),
        ...section(`Due within ${dueSoonDays} days:`, soon),
        'You receive one reminder per finding when it comes due and one if it passes its due date.',
        '',
      ]
    : [];
  const ndtText = ndt.text.length
    ? [
        'The non-destructive tests (NDT) the design data plans at these rides’ pivots are coming due or ' +
          'overdue. Have them made by a certified technician and the records added; the link shows each ' +
          'pivot’s plan and records.',
        '',
        ...ndt.text,
      ]
    : [];
  const text = [`To ${companyName}:`, '', ...findingsText, ...ndtText].join('\n').trimEnd();

  const h = escapeHtml;
  const htmlItem = (i: Due) =>
    `<li><strong>${h(i.rideName)}, finding ${i.number}</strong> [${h(severityInfo[i.severity].label)}]: ` +
    `${h(i.description)}` +
    (i.requiredAction ? `<br>Required action: ${h(i.requiredAction)}` : '') +
    `<br>Due <strong>${h(formatCalendarDate(i.dueOn))}</strong> (${h(when(i.dueOn, today))}) · ` +
    `<a href="${h(link(i))}">notice ${h(i.noticeReference)}</a></li>`;
  const htmlSection = (title: string, list: Due[]) =>
    list.length ? `<h3>${h(title)}</h3><ul>${list.map(htmlItem).join('')}</ul>` : '';
  const html = [
    htmlMailStart,
    `<p>To ${h(companyName)}:</p>`,
    ...(items.length
      ? [
          '<p>These findings from notices issued to you are still open. Report what you have done about each ' +
            'one with the link beside it; the inspection body then verifies and closes it.</p>',
          htmlSection('Past due', past),
          htmlSection(`Due within ${dueSoonDays} days`, soon),
          '<p>You receive one reminder per finding when it comes due and one if it passes its due date.</p>',
        ]
      : []),
    ...(ndt.html
      ? [
          '<p>The non-destructive tests (NDT) the design data plans at these rides’ pivots are coming due or ' +
            'overdue. Have them made by a certified technician and the records added.</p>',
          ndt.html,
        ]
      : []),
    '</body></html>',
  ].join('\n');
  return { subject, text, html };
}

type ZoneGroup = { zone: string; today: string; rideIds: string[] };

/**
 * The rides whose site clock has reached the reminder hour at `now`, by zone (a site's zone, else the
 * inspection body's default), each with the date on that clock: their "today".
 */
export function reminderGroups(db: Pick<Db, 'select'>, now: Date, hour = REMINDER_HOUR): ZoneGroup[] {
  const byZone = new Map<string, string[]>();
  for (const r of db
    .select({ id: rides.id, zone: siteZoneSql })
    .from(rides)
    .leftJoin(sites, eq(sites.id, rides.siteId))
    .all())
    byZone.set(r.zone, [...(byZone.get(r.zone) ?? []), r.id]);
  return [...byZone]
    .filter(([zone]) => hourInZone(now, zone) >= hour)
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([zone, rideIds]) => ({ zone, today: dayInZone(now, zone), rideIds }));
}

/**
 * One run of the reminder job at `now`: for the rides whose site clock has reached 07:00 (its own date
 * being their "today"), each operator company with findings newly due soon or past due gets one e-mail per
 * notice address and zone, queued with the stages recorded. Running again finds nothing new, so an hourly
 * job sends each site's reminders at its first run from 07:00 local.
 */
export function runReminders(deps: ReminderDeps, now: Date): ReminderRun {
  const at = now.toISOString();
  const run: ReminderRun = { companies: 0, reminded: [], noAddress: [], ndt: [] };
  deps.db.transaction((tx) => {
    for (const group of reminderGroups(tx, now)) remindGroup(deps, tx, group, at, run);
  });
  if (run.companies > 0) deliveriesQueued();
  return run;
}

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

function remindGroup(
  deps: ReminderDeps,
  tx: Tx,
  { today, rideIds }: ZoneGroup,
  at: string,
  run: ReminderRun,
) {
  {
    const byCompany = new Map<string, Due[]>();
    for (const item of dueFindings(tx, today, rideIds))
      byCompany.set(item.companyId, [...(byCompany.get(item.companyId) ?? []), item]);
    const ndtByCompany = new Map<string, NdtReminderItem[]>();
    for (const item of dueNdtTests(tx, today, rideIds)) {
      ndtByCompany.set(item.companyId, [...(ndtByCompany.get(item.companyId) ?? []), item]);
      if (!byCompany.has(item.companyId)) byCompany.set(item.companyId, []);
    }

    for (const [companyId, items] of byCompany) {
      const ndt = ndtByCompany.get(companyId) ?? [];
      const { companyName, noticeEmails } = items[0] ?? ndt[0];
      const recipients = [...new Set(noticeEmails.map((e) => e.trim().toLowerCase()).filter(Boolean))];
      if (recipients.length === 0) {
        run.noAddress.push(companyName);
        deps.logger?.warn(
          { company: companyName },
          'findings to remind about, but the company has no notice address',
        );
        continue;
      }
      const pairs = [
        ...items.map((i) => `${i.findingId}:${i.stage}`),
        ...ndt.map((i) => `ndt:${i.rideId}:${i.joint}:${i.method}:${i.dueOn}:${i.stage}`),
      ].sort();
      const content = reminderEmail(
        companyName,
        items,
        today,
        deps.appUrl,
        ndtReminderSections(ndt, today, deps.appUrl),
      );
      tx.insert(noticeDeliveries)
        .values(
          recipients.map((recipient) => ({
            kind: 'reminder' as const,
            operatorCompanyId: companyId,
            recipient,
            // The same findings × stages to the same address is the same message, however often queued.
            idempotencyKey: `reminder.${shortHash(pairs.join(','))}.${shortHash(recipient)}`,
            content,
            createdAt: at,
            nextAttemptAt: at,
          })),
        )
        .onConflictDoNothing()
        .run();
      if (items.length)
        tx.insert(findingReminders)
          .values(items.map((i) => ({ findingId: i.findingId, stage: i.stage, sentAt: at })))
          .onConflictDoNothing()
          .run();
      recordNdtReminders(tx, ndt, at);
      run.companies += 1;
      run.reminded.push(...items.map((i) => ({ findingId: i.findingId, stage: i.stage })));
      run.ndt.push(
        ...ndt.map(({ rideId, joint, method, dueOn, stage }) => ({ rideId, joint, method, dueOn, stage })),
      );
    }
  }
}

type ReminderJob = { stop: () => void; nextRun: () => Date | null };

/**
 * Schedules `runReminders` with croner: at the top of every hour (UTC), so each site's reminders go out
 * from 07:00 on its own clock, unless `schedule` (a cron pattern) and `timezone` say otherwise. A run that
 * throws is logged; the next hour's run tries again.
 */
export function startReminderJob(
  deps: ReminderDeps & { schedule?: string; timezone?: string; now?: () => Date },
): ReminderJob {
  const job = new Cron(
    deps.schedule ?? '0 * * * *',
    { timezone: deps.timezone ?? 'UTC', protect: true },
    () => {
      try {
        const run = runReminders(deps, deps.now?.() ?? new Date());
        deps.logger?.info(
          {
            companies: run.companies,
            reminded: run.reminded.length,
            ndt: run.ndt.length,
            noAddress: run.noAddress,
          },
          'finding reminders queued',
        );
      } catch (error) {
        deps.logger?.error({ err: error }, 'finding reminders failed');
      }
    },
  );
  return { stop: () => job.stop(), nextRun: () => job.nextRun() };
}
