/**
 * Part replacements, one entry when each was recorded: the component, its serial and maker, who fitted it
 * and on which day, and whether it corrects (or was later corrected by) another record. Its certificates
 * are read at `/api/documents/:sha256` by whoever may read the ride, so everyone who sees the ride sees
 * them. (`server/parts/logbook.ts` says the same of a whole ride; here the range is pushed into SQL.)
 */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { partReplacementDocuments, partReplacements } from '@/db/server/parts';
import { users } from '@/db/server/schema';
import type { LogbookEvent } from '@/features/logbook/schema';
import { formatDate } from '@/lib/dates';
import { everyone, inRange, lines, pdfFileName, when, type LogbookSource } from '@/server/logbook/source';

const corrected = alias(partReplacements, 'logbook_part_corrected');

export const partsSource: LogbookSource = {
  kind: 'part',
  shownTo: everyone,
  read: (db, q) => {
    const rows = db
      .select({
        r: partReplacements,
        recorderName: users.name,
        correctsSerial: corrected.serialNumber,
        correctsFittedOn: corrected.fittedOn,
        correctedAt: sql<
          string | null
        >`(SELECT max(c.created_at) FROM part_replacements c WHERE c.corrects_id = ${partReplacements.id})`,
      })
      .from(partReplacements)
      .leftJoin(users, eq(users.id, partReplacements.createdBy))
      .leftJoin(corrected, eq(corrected.id, partReplacements.correctsId))
      .where(and(eq(partReplacements.rideId, q.rideId), inRange(partReplacements.createdAt, q)))
      .all();
    if (rows.length === 0) return [];
    const docs = db
      .select()
      .from(partReplacementDocuments)
      .where(
        inArray(
          partReplacementDocuments.replacementId,
          rows.map(({ r }) => r.id),
        ),
      )
      .orderBy(asc(partReplacementDocuments.position))
      .all();
    return rows.map(({ r, recorderName, correctsSerial, correctsFittedOn, correctedAt }): LogbookEvent => ({
      id: `part:${r.id}`,
      rideId: q.rideId,
      ...when(r.createdAt, q.zone),
      kind: 'part',
      title: `${r.component}${r.pivotName ? ` at ${r.pivotName}` : ''} replaced: serial ${r.serialNumber}`,
      detail: lines(
        `Made by ${r.maker}`,
        `Fitted ${formatDate(r.fittedOn)} by ${r.fittedBy}`,
        r.replacedSerial ? `Replaces serial ${r.replacedSerial}` : null,
        r.note,
        r.correctsId
          ? `Corrects the record of ${correctsSerial ?? 'an earlier part'}${correctsFittedOn ? ` fitted ${formatDate(correctsFittedOn)}` : ''}`
          : null,
        correctedAt ? `Corrected by a later record (${when(correctedAt, q.zone).day})` : null,
      ),
      who: recorderName,
      link: { label: 'Open the parts', href: `/rides/${encodeURIComponent(q.rideId)}/parts` },
      documents: docs
        .filter((d) => d.replacementId === r.id)
        .map((d) => ({
          label: d.title,
          apiPath: `/api/documents/${d.sha256}`,
          fileName: pdfFileName(d.title),
        })),
    }));
  },
};
