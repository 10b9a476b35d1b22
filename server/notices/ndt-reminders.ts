/**
 * The NDT part of the daily reminders: planned tests at an operator's rides that fall due within the NDT
 * window (30 days: a technician has to be booked) or are past their due date, each stage once per due
 * date (`ndt_reminders`). Rides are found through their pivot-life flags (kept whenever NDT records, design
 * data or schedules change), so the daily run reads only rides with something coming due.
 */
import { and, asc, eq, inArray, lte } from 'drizzle-orm';

import { ndtReminders, rideLifeFlags, type NdtReminderStage } from '@/db/server/ndt';
import { companies, rides } from '@/db/server/schema';
import type { NdtMethod } from '@/features/loads/design-schema';
import { NDT_DUE_WINDOW_DAYS } from '@/features/pivot-life/ndt-due';
import { NDT_METHOD_WORDS } from '@/features/pivot-life/ndt-schema';
import { addDays, daysBetween, formatCalendarDate } from '@/lib/dates';
import { appLink, rideNdtPath } from '@/lib/paths';
import type { Db } from '@/server/db';
import { rideNdt } from '@/server/pivot-life/ndt';
import { escapeHtml } from '@/server/notices/words';

export type NdtReminderItem = {
  rideId: string;
  rideName: string;
  companyId: string;
  companyName: string;
  noticeEmails: string[];
  joint: number;
  pivotName: string;
  method: NdtMethod;
  intervalDays: number;
  lastOn: string | null;
  dueOn: string;
  stage: NdtReminderStage;
};

/** Planned tests newly due within the window or newly past due on `today`, by company then ride. */
export function dueNdtTests(
  db: Pick<Db, 'select'>,
  today: string,
  rideIds?: readonly string[],
): NdtReminderItem[] {
  const horizon = addDays(today, NDT_DUE_WINDOW_DAYS);
  const candidates = db
    .select({
      rideId: rides.id,
      rideName: rides.name,
      companyId: companies.id,
      companyName: companies.name,
      noticeEmails: companies.noticeEmails,
    })
    .from(rideLifeFlags)
    .innerJoin(rides, eq(rides.id, rideLifeFlags.rideId))
    .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
    .where(and(lte(rideLifeFlags.ndtDueOn, horizon), rideIds ? inArray(rides.id, [...rideIds]) : undefined))
    .orderBy(asc(companies.name), asc(rides.name))
    .all();
  const items: NdtReminderItem[] = [];
  for (const ride of candidates) {
    const sent = new Set(
      db
        .select({
          joint: ndtReminders.joint,
          method: ndtReminders.method,
          dueOn: ndtReminders.dueOn,
          stage: ndtReminders.stage,
        })
        .from(ndtReminders)
        .where(and(eq(ndtReminders.rideId, ride.rideId)))
        .all()
        .map((s) => `${s.joint}:${s.method}:${s.dueOn}:${s.stage}`),
    );
    for (const pivot of rideNdt(db, { id: ride.rideId, name: ride.rideName }, today).pivots)
      for (const due of pivot.due) {
        if (due.dueOn === null || due.dueOn > horizon) continue;
        const stage: NdtReminderStage = due.dueOn < today ? 'past_due' : 'due_soon';
        const key = (s: NdtReminderStage) => `${pivot.joint}:${due.method}:${due.dueOn}:${s}`;
        // Already past due when first seen: only the past-due reminder, as with findings.
        if (sent.has(key(stage)) || (stage === 'due_soon' && sent.has(key('past_due')))) continue;
        items.push({
          ...ride,
          joint: pivot.joint,
          pivotName: pivot.name,
          method: due.method,
          intervalDays: due.intervalDays,
          lastOn: due.lastOn,
          dueOn: due.dueOn,
          stage,
        });
      }
  }
  return items;
}

/** Records the reminders as sent, in the transaction that queues their e-mail. */
export function recordNdtReminders(tx: Pick<Db, 'insert'>, items: NdtReminderItem[], at: string): void {
  if (items.length === 0) return;
  tx.insert(ndtReminders)
    .values(
      items.map((i) => ({
        rideId: i.rideId,
        joint: i.joint,
        method: i.method,
        dueOn: i.dueOn,
        stage: i.stage,
        sentAt: at,
      })),
    )
    .onConflictDoNothing()
    .run();
}

function when(dueOn: string, today: string): string {
  const days = daysBetween(today, dueOn);
  if (days < 0) return `${-days} day${days === -1 ? '' : 's'} overdue`;
  if (days === 0) return 'due today';
  return `due in ${days} day${days === 1 ? '' : 's'}`;
}

const what = (i: NdtReminderItem) =>
  `${i.rideName}, ${i.pivotName}: ${NDT_METHOD_WORDS[i.method]} (${i.method}) every ${i.intervalDays} days`;
const last = (i: NdtReminderItem) =>
  i.lastOn ? `last tested ${formatCalendarDate(i.lastOn)}` : 'no test recorded since the plan took effect';

/** The NDT sections of a company's reminder e-mail, as text lines and HTML. */
export function ndtReminderSections(items: NdtReminderItem[], today: string, appUrl: string) {
  const past = items.filter((i) => i.stage === 'past_due');
  const soon = items.filter((i) => i.stage === 'due_soon');
  const link = (i: NdtReminderItem) => appLink(appUrl, rideNdtPath(i.rideId));
  const line = (i: NdtReminderItem) =>
    `- ${what(i)}\n  Due ${formatCalendarDate(i.dueOn)} (${when(i.dueOn, today)}), ${last(i)}: ${link(i)}`;
  const section = (title: string, list: NdtReminderItem[]) =>
    list.length ? [title, ...list.map(line), ''] : [];
  const text = [
    ...section('NDT overdue:', past),
    ...section(`NDT due within ${NDT_DUE_WINDOW_DAYS} days:`, soon),
  ];
  const h = escapeHtml;
  const htmlItem = (i: NdtReminderItem) =>
    `<li><strong>${h(what(i))}</strong><br>Due <strong>${h(formatCalendarDate(i.dueOn))}</strong> ` +
    `(${h(when(i.dueOn, today))}), ${h(last(i))} · <a href="${h(link(i))}">NDT of ${h(i.rideName)}</a></li>`;
  const htmlSection = (title: string, list: NdtReminderItem[]) =>
    list.length ? `<h3>${h(title)}</h3><ul>${list.map(htmlItem).join('')}</ul>` : '';
  const html = [
    htmlSection('NDT overdue', past),
    htmlSection(`NDT due within ${NDT_DUE_WINDOW_DAYS} days`, soon),
  ]
    .filter(Boolean)
    .join('\n');
  const counts = [
    past.length ? `${past.length} overdue` : null,
    soon.length ? `${soon.length} due within ${NDT_DUE_WINDOW_DAYS} days` : null,
  ].filter(Boolean);
  return { text, html, subject: counts.length ? `NDT ${counts.join(', ')}` : null };
}
