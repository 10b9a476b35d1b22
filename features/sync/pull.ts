/**
 * Pulls what changed on the server since the stored cursor. Each page is checked against the pull
 * schema and written together with its new cursor in one transaction: a bad or cut answer changes
 * nothing, and the next pull asks again from the same place.
 */
import { ApiRequestError } from '@/lib/api-errors';
import type { DeviceDb } from '@/features/device-db';
import {
  removeCached,
  writeAssignments,
  writeDecisions,
  writeDesignVersions,
  writeRides,
  writeTemplates,
} from '@/features/sync/cache';
import { getSyncMeta, setSyncMeta } from '@/features/device-db';
import { writeDeclarationSetting, writeInstruments } from '@/features/instruments';
import type { SyncApi } from '@/features/sync/api';
import { type PullResponse, pullResponseSchema } from '@/features/sync/pull-schema';

export type PullReport = {
  pages: number;
  rides: number;
  designs: number;
  templates: number;
  assignments: number;
  decisions: number;
  instruments: number;
  cursor: string | null;
};

/** A server that keeps saying "more" would otherwise hold the sync forever. */
const MAX_PULL_PAGES = 20;

export class PullResponseError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PullResponseError';
  }
}

function isStaleCursor(err: unknown): boolean {
  return (
    err instanceof ApiRequestError && err.status === 400 && err.issues.some((i) => i.path === 'query.cursor')
  );
}

export async function pull(
  api: SyncApi,
  dev: DeviceDb,
  options: {
    now?: () => Date;
    /** Pages stored so far, and whether the server said more follow (their number is never known ahead). */
    onPage?: (pages: number, more: boolean) => void;
  } = {},
): Promise<PullReport> {
  const clock = options.now ?? (() => new Date());
  let cursor = await getSyncMeta(dev, 'pullCursor');
  const report: PullReport = {
    pages: 0,
    rides: 0,
    designs: 0,
    templates: 0,
    assignments: 0,
    decisions: 0,
    instruments: 0,
    cursor,
  };

  let restarted = false;
  for (let page = 0; page < MAX_PULL_PAGES; page++) {
    let raw: unknown;
    try {
      raw = await api.pull(cursor);
    } catch (err) {
      // A cursor the server no longer knows (its data was reset or moved): download everything again.
      if (cursor !== null && !restarted && isStaleCursor(err)) {
        restarted = true;
        cursor = null;
        page--;
        continue;
      }
      throw err;
    }
    const parsed = pullResponseSchema.safeParse(raw);
    if (!parsed.success) {
      const first = parsed.error.issues[0];
      throw new PullResponseError(
        `The server's update did not have the expected shape (${first?.path.join('.') || 'answer'}: ${first?.message}).`,
      );
    }
    const res: PullResponse = parsed.data;
    const now = clock();
    await dev.transaction(async (tx) => {
      if (res.rides) await writeRides(tx, res.rides, now);
      if (res.designs) await writeDesignVersions(tx, res.designs);
      if (res.templates) await writeTemplates(tx, res.templates, now);
      if (res.assignments) await writeAssignments(tx, res.assignments, now);
      if (res.decisions) await writeDecisions(tx, res.decisions, now);
      if (res.removed) await removeCached(tx, res.removed);
      if (res.instruments) await writeInstruments(tx, res.instruments, now);
      if (res.declaration) await writeDeclarationSetting(tx, res.declaration, now);
      await setSyncMeta(tx, 'pullCursor', res.cursor);
    });
    report.pages++;
    report.rides += res.rides?.length ?? 0;
    report.designs += res.designs?.length ?? 0;
    report.templates += res.templates?.length ?? 0;
    report.assignments += res.assignments?.length ?? 0;
    report.decisions += res.decisions?.length ?? 0;
    report.instruments += res.instruments?.length ?? 0;
    report.cursor = cursor = res.cursor;
    options.onPage?.(report.pages, !!res.hasMore);
    if (!res.hasMore) break;
  }
  return report;
}
