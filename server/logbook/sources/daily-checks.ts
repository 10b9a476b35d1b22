/**
 * Operators' daily pre-opening checks (inspections of type `daily_pre_opening`, which the inspection
 * source leaves out): passed, or which items and test runs failed, and who made it. Staff see every one;
 * an operator the checks made by their own company's people (a ride that changed hands keeps its earlier
 * operator's checks from the new one, as notices do).
 */
import { and, eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { users } from '@/db/server/schema';
import { DAILY_CHECK_TYPE } from '@/features/daily-checks/schema';
import type { LogbookEvent } from '@/features/logbook/schema';
import { everyone, inRange, isOperator, lines, when, type LogbookSource } from '@/server/logbook/source';

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

export const dailyChecksSource: LogbookSource = {
  kind: 'daily_check',
  shownTo: everyone,
  read: (db, q) =>
    db
      .select({
        id: inspections.id,
        submittedAt: inspections.submittedAt,
        failedItems: inspections.failedItems,
        record: inspections.record,
        byName: users.name,
      })
      .from(inspections)
      .innerJoin(users, eq(users.id, inspections.inspectorId))
      .where(
        and(
          eq(inspections.rideId, q.rideId),
          eq(inspections.type, DAILY_CHECK_TYPE),
          isOperator(q.viewer) ? eq(users.companyId, q.viewer.companyId ?? '') : undefined,
          inRange(inspections.submittedAt, q),
        ),
      )
      .all()
      .map((r): LogbookEvent => {
        const failed = r.record.checklist.filter((c) => c.result === 'fail');
        const runs = r.record.testRuns ?? [];
        const failedRuns = runs.filter((t) => t.result === 'fail');
        const passed = r.failedItems === 0 && failedRuns.length === 0;
        return {
          id: `daily_check:${r.id}`,
          rideId: q.rideId,
          ...when(r.submittedAt, q.zone),
          kind: 'daily_check',
          title: passed ? 'Daily check passed' : 'Daily check failed: the ride must not open',
          detail: lines(
            `${plural(r.record.checklist.length, 'item')} checked`,
            failed.length > 0 ? `Failed: ${failed.map((c) => c.text).join('; ')}` : null,
            runs.length > 0
              ? `Test runs: ${plural(
                  runs.reduce((n, t) => n + t.cycles, 0),
                  'cycle',
                )}${failedRuns.length > 0 ? `, ${plural(failedRuns.length, 'run')} failed` : ', all passed'}`
              : null,
          ),
          who: r.byName,
          link: { label: 'Open the ride', href: `/rides/${encodeURIComponent(q.rideId)}` },
          documents: [],
        };
      }),
};
