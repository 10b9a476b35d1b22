/**
 * Sending what `notice_deliveries` holds: each row is one message to one recipient, claimed, sent and
 * marked through `deliverOnce` (server/mail/deliver.ts), whose file comment explains the one hard case —
 * a crash after the SMTP server took the message and before the row said so. In short: such a row stays
 * `sending`, is claimed again once the lease has run out, and goes out again under the SAME idempotency
 * key (hence the same Message-ID and X-Pivotwatch-Key header). Our local mailbox drops the copy; a real
 * SMTP server delivers it, and mail clients show it as the same message. We accept that rare copy rather
 * than risk an operator never hearing of a stop-now finding. A notice is rendered to PDF when it is sent
 * (the document is frozen, and the rendering deterministic, so every copy is the same bytes).
 */

import { and, asc, eq } from 'drizzle-orm';

import { photos } from '@/db/server/inspections';
import { noticeDeliveries, notices, type NoticeDeliveryRow } from '@/db/server/notices';
import { companies } from '@/db/server/schema';
import { CAUTION_SHORT } from '@/lib/caution-text';
import { colors } from '@/lib/colors';
import { ENVELOPE_STATUS_LABEL } from '@/features/loads/engine';
import { formatRatio } from '@/features/loads/format';
import { noticeUnitsText, type NoticeDocument } from '@/features/notices/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import type { Db } from '@/server/db';
import type { Logger } from '@/server/logger';
import { sqliteOf } from '@/server/sqlite-client';
import { deliverOnce, deliveryDue, deliveryRowHooks, type DeliveryOutcome } from '@/server/mail/deliver';
import { deliveryKey, type Mailer, type OutgoingMail } from '@/server/mail/mailer';
import type { RetryPolicy } from '@/server/mail/retry';
import { deliveriesQueued, onDeliveriesQueued } from '@/server/notices/nudge';
import { formatCalendarDate, formatWhen } from '@/lib/dates';
import { renderNoticePdf } from '@/server/notices/pdf';
import { noticeChainMark } from '@/server/ledger/notice-mark';
import { cachedNoticePdf } from '@/server/notices/pdf/cache';
import { pivotLifeHtml, pivotLifeTextLines } from '@/server/notices/pivot-life-mail';
import { escapeHtml, htmlMailStart, noticeSubject, rideStatusWords } from '@/server/notices/words';
import type { ObjectStorage } from '@/server/storage';
import { readPhoto } from '@/server/sync/photo-store';

type DeliveryDeps = {
  db: Db;
  mailer: Mailer;
  /** Where photo bytes live (for the PDF's thumbnails) and notice PDFs are cached (server/storage). */
  storage: ObjectStorage;
  logger?: Logger;
  /** Paper of attached PDFs for notices issued before their paper was frozen with them; A4 unless set. */
  pageSize?: 'A4' | 'LETTER';
  /** Rows handled per run. */
  batchSize?: number;
  random?: () => number;
  policy?: RetryPolicy;
};

type DeliveryRunResult = { sent: number; retry: number; failed: number; skipped: number };

// ——— the notice e-mail ———

function findingLines(doc: NoticeDocument): string[] {
  return doc.findings.flatMap((f) => [
    `${f.number}. [${severityInfo[f.severity].label}] ${f.description}`,
    ...(f.requiredAction ? [`   Required action: ${f.requiredAction}`] : []),
    ...(f.dueOn ? [`   Due: ${formatCalendarDate(f.dueOn)}`] : []),
  ]);
}

/**
 * The values at or over their limits, with the very strings the notice holds (formatted once when it was
 * issued by lib/measured-format.ts), so the e-mail, the app and the PDF print the same numbers.
 */
function concerning(doc: NoticeDocument) {
  return doc.results.filter((r) => r.status !== 'within');
}
const resultLine = (r: NoticeDocument['results'][number]) =>
  `${r.label}: ${r.value}, limit ${r.limit}, ${formatRatio(r.ratio)} of the allowance — ${ENVELOPE_STATUS_LABEL[r.status]}`;

function resultLines(doc: NoticeDocument): string[] {
  const list = concerning(doc);
  return list.length > 0
    ? [
        '',
        `Values near or over their limits (${list.length}). ${noticeUnitsText(doc)}`,
        ...list.map((r) => `- ${resultLine(r)}`),
      ]
    : [];
}

function resultsHtml(doc: NoticeDocument): string {
  const list = concerning(doc);
  if (list.length === 0) return '';
  const items = list.map((r) => `<li>${escapeHtml(resultLine(r))}</li>`).join('');
  return `<h3>Values near or over their limits (${list.length})</h3><p>${escapeHtml(noticeUnitsText(doc))}</p><ul>${items}</ul>`;
}

function rideLine(doc: NoticeDocument) {
  const parts = [doc.ride.rideClass, doc.ride.serial ? `serial ${doc.ride.serial}` : null].filter(Boolean);
  return `${doc.ride.name} (${parts.join(', ')})${doc.site ? ` at ${doc.site.name}` : ''}`;
}

/** The notice e-mail: the essentials in the body, the whole notice as the attached PDF. */
export function noticeEmail(doc: NoticeDocument): Pick<OutgoingMail, 'subject' | 'text' | 'html'> {
  const status = `${rideStatusWords[doc.operatingStatus.status]}${doc.operatingStatus.reason ? ` — ${doc.operatingStatus.reason}` : ''}`;
  const inspection = doc.inspection
    ? `${doc.inspection.typeLabel} on ${formatCalendarDate(doc.inspection.date)} by ${doc.inspection.inspectorName}`
    : null;
  const reinspection = doc.reinspection.required
    ? `Required${doc.reinspection.reason ? ` — ${doc.reinspection.reason}` : ''}`
    : 'Not required';
  const intro =
    doc.kind === 'inspection'
      ? `${doc.issuer.name} has issued notice ${doc.reference} to ${doc.operator.name} after an inspection of ${doc.ride.name}.`
      : `${doc.issuer.name} has issued notice ${doc.reference} to ${doc.operator.name}: the status of ${doc.ride.name} has changed.`;
  const facts: [string, string][] = [
    ['Ride', rideLine(doc)],
    ...(inspection ? [['Inspection', inspection] as [string, string]] : []),
    ['Operating status', status],
    ['Re-inspection', reinspection],
    ['Issued', `${formatWhen(doc.issuedAt, doc.timeZone)} by ${doc.signature.name}, ${doc.signature.role}`],
  ];

  const text = [
    intro,
    '',
    ...facts.map(([k, v]) => `${k}: ${v}`),
    '',
    doc.findings.length > 0 ? `Findings (${doc.findings.length}):` : 'No findings are listed on this notice.',
    ...findingLines(doc),
    ...resultLines(doc),
    ...pivotLifeTextLines(doc),
    ...(doc.note ? ['', `Note from ${doc.signature.name}: ${doc.note}`] : []),
    '',
    'Open the notice to acknowledge it and to report the corrective action for each finding:',
    doc.url,
    '',
    `The complete notice is attached as ${doc.reference}.pdf.`,
    '',
    `Caution: ${CAUTION_SHORT}`,
  ].join('\n');

  const h = escapeHtml;
  const findingItems = doc.findings
    .map(
      (f) =>
        `<li><strong>[${h(severityInfo[f.severity].label)}]</strong> ${h(f.description)}` +
        (f.requiredAction ? `<br>Required action: ${h(f.requiredAction)}` : '') +
        (f.dueOn ? `<br>Due: <strong>${h(formatCalendarDate(f.dueOn))}</strong>` : '') +
        '</li>',
    )
    .join('');
  const html = [
    htmlMailStart,
    `<p>${h(intro)}</p>`,
    '<table cellpadding="4" style="border-collapse: collapse">',
    ...facts.map(([k, v]) => `<tr><th align="left" valign="top">${h(k)}</th><td>${h(v)}</td></tr>`),
    '</table>',
    doc.findings.length > 0
      ? `<h3>Findings (${doc.findings.length})</h3><ol>${findingItems}</ol>`
      : '<p>No findings are listed on this notice.</p>',
    resultsHtml(doc),
    pivotLifeHtml(doc),
    doc.note ? `<p><strong>Note from ${h(doc.signature.name)}:</strong> ${h(doc.note)}</p>` : '',
    `<p><a href="${h(doc.url)}">Open notice ${h(doc.reference)}</a> to acknowledge it and to report the corrective action for each finding.</p>`,
    `<p>The complete notice is attached as ${h(doc.reference)}.pdf.</p>`,
    `<p style="border-left: 4px solid ${colors.accent}; padding-left: 8px; font-size: 90%"><strong>Caution.</strong> ${h(CAUTION_SHORT)}</p>`,
    '</body></html>',
  ].join('\n');

  return { subject: noticeSubject(doc), text, html };
}

/** Photo bytes for the PDF's thumbnails; null (printed as "not available") when the server lacks them. */
function photoLoader(db: Db, storage: ObjectStorage) {
  return async (sha256: string): Promise<Buffer | null> => {
    if (!/^[0-9a-f]{64}$/.test(sha256)) return null;
    const known = db.select({ sha256: photos.sha256 }).from(photos).where(eq(photos.sha256, sha256)).get();
    if (!known) return null;
    try {
      return await readPhoto(storage, sha256);
    } catch {
      return null;
    }
  };
}

/** The notice's PDF, as attached to its e-mails and served at /api/notices/:id/pdf. */
export function noticePdf(
  db: Db,
  storage: ObjectStorage,
  doc: NoticeDocument,
  pageSize: 'A4' | 'LETTER' = 'A4',
) {
  return renderNoticePdf(doc, {
    pageSize,
    loadPhoto: photoLoader(db, storage),
    chain: noticeChainMark(db, doc),
  });
}

// ——— the worker ———

async function mailFor(
  deps: DeliveryDeps,
  row: NoticeDeliveryRow,
  pdfs: Map<string, Promise<{ doc: NoticeDocument; pdf: Buffer }>>,
): Promise<OutgoingMail & { to: string }> {
  if (row.kind === 'reminder' || row.noticeId === null) {
    if (!row.content) throw new Error(`delivery ${row.id} has no content`);
    return { to: row.recipient, idempotencyKey: row.idempotencyKey, ...row.content };
  }
  const noticeId = row.noticeId;
  let rendered = pdfs.get(noticeId);
  if (!rendered) {
    rendered = (async () => {
      const notice = deps.db
        .select({ document: notices.document })
        .from(notices)
        .where(eq(notices.id, noticeId))
        .get();
      if (!notice) throw new Error(`notice ${noticeId} is missing`);
      // The same file GET /api/notices/:id/pdf serves: drawn once per notice and paper size.
      // The paper the notice was issued on (its company's choice, frozen with it).
      const pageSize = notice.document.paper ?? deps.pageSize ?? 'A4';
      const { pdf } = await cachedNoticePdf(
        deps.db,
        deps.storage,
        { id: noticeId, document: notice.document, pageSize },
        () => noticePdf(deps.db, deps.storage, notice.document, pageSize),
      );
      return { doc: notice.document, pdf };
    })();
    pdfs.set(noticeId, rendered);
  }
  const { doc, pdf } = await rendered;
  return {
    to: row.recipient,
    idempotencyKey: row.idempotencyKey,
    ...noticeEmail(doc),
    attachments: [{ filename: `${doc.reference}.pdf`, content: pdf, contentType: 'application/pdf' }],
  };
}

/**
 * Sends every delivery due at `now` (up to `batchSize`), one at a time. A row whose message cannot even
 * be built (a rendering fault) is marked failed with the reason, so it is shown rather than retried for
 * ever; everything else follows the mail layer's retry policy.
 */
export async function processDeliveries(
  deps: DeliveryDeps,
  now: Date = new Date(),
): Promise<DeliveryRunResult> {
  const rows = deps.db
    .select()
    .from(noticeDeliveries)
    .where(deliveryDue(noticeDeliveries, now))
    .orderBy(asc(noticeDeliveries.nextAttemptAt), asc(noticeDeliveries.createdAt))
    .limit(deps.batchSize ?? 50)
    .all();
  const result: DeliveryRunResult = { sent: 0, retry: 0, failed: 0, skipped: 0 };
  const pdfs = new Map<string, Promise<{ doc: NoticeDocument; pdf: Buffer }>>();
  for (const row of rows) {
    const hooks = deliveryRowHooks(sqliteOf(deps.db), 'notice_deliveries', row.id);
    let mail: OutgoingMail & { to: string };
    try {
      mail = await mailFor(deps, row, pdfs);
    } catch (error) {
      const claimed = await hooks.claim(now);
      if (!claimed) {
        result.skipped += 1;
        continue;
      }
      const message = `The message could not be prepared: ${error instanceof Error ? error.message : String(error)}`;
      deps.logger?.error({ err: error, delivery: row.id }, 'could not prepare a notice e-mail');
      await hooks.markFailed({
        attempt: claimed.attempt,
        error: { kind: 'permanent', message, code: 'EPREPARE', responseCode: null, command: null },
        at: now,
      });
      result.failed += 1;
      continue;
    }
    const outcome: DeliveryOutcome = await deliverOnce({
      mailer: deps.mailer,
      mail,
      hooks,
      now: () => now,
      random: deps.random,
      policy: deps.policy,
      logger: deps.logger,
    });
    result[outcome.status] += 1;
  }
  return result;
}

type DeliveryLoop = {
  /** Run soon (coalesced with a run in progress). */
  nudge: () => void;
  /** Resolves when the run in progress, if any, has finished. */
  idle: () => Promise<void>;
  stop: () => Promise<void>;
};

/**
 * Runs `processDeliveries` now, every `intervalMs` (a minute by default; retries are due on their own
 * schedule and picked up at the next tick), and whenever a notice or reminder is queued. Runs never
 * overlap: a nudge during a run makes one more run afterwards.
 */
export function startDeliveryLoop(
  deps: DeliveryDeps & { intervalMs?: number; now?: () => Date },
): DeliveryLoop {
  let running: Promise<void> | null = null;
  let again = false;
  let stopped = false;

  const run = (): void => {
    if (stopped) return;
    if (running) {
      again = true;
      return;
    }
    running = (async () => {
      do {
        again = false;
        try {
          const r = await processDeliveries(deps, deps.now?.() ?? new Date());
          if (r.sent + r.retry + r.failed > 0) deps.logger?.info(r, 'notice e-mail run');
        } catch (error) {
          deps.logger?.error({ err: error }, 'notice e-mail run failed');
        }
      } while (again && !stopped);
    })().finally(() => {
      running = null;
    });
  };

  const timer = setInterval(run, deps.intervalMs ?? 60_000);
  timer.unref();
  const unsubscribe = onDeliveriesQueued(run);
  run();
  return {
    nudge: run,
    idle: async () => {
      while (running) await running;
    },
    stop: async () => {
      stopped = true;
      clearInterval(timer);
      unsubscribe();
      while (running) await running;
    },
  };
}

// ——— sending again ———

/**
 * Queues a notice again: a delivery for each current notice address of the operator that has none (an
 * address added since, or a company that had none), and failed deliveries back to pending with a fresh
 * count. Rows already sent stay sent: the key is the same, so nothing reaches anyone twice. Returns how
 * many rows were queued.
 */
export function requeueNotice(db: Pick<Db, 'select' | 'insert' | 'update'>, noticeId: string, now: Date) {
  const notice = db
    .select({ id: notices.id, operatorId: notices.operatorCompanyId, noticeEmails: companies.noticeEmails })
    .from(notices)
    .innerJoin(companies, eq(companies.id, notices.operatorCompanyId))
    .where(eq(notices.id, noticeId))
    .get();
  if (!notice) return 0;
  const at = now.toISOString();
  const have = new Set(
    db
      .select({ recipient: noticeDeliveries.recipient })
      .from(noticeDeliveries)
      .where(eq(noticeDeliveries.noticeId, noticeId))
      .all()
      .map((r) => r.recipient),
  );
  const fresh = [...new Set(notice.noticeEmails.map((e) => e.trim().toLowerCase()).filter(Boolean))].filter(
    (r) => !have.has(r),
  );
  if (fresh.length > 0)
    db.insert(noticeDeliveries)
      .values(
        fresh.map((recipient) => ({
          kind: 'notice' as const,
          noticeId,
          operatorCompanyId: notice.operatorId,
          recipient,
          idempotencyKey: deliveryKey(noticeId, recipient),
          createdAt: at,
          nextAttemptAt: at,
        })),
      )
      .run();
  const retried = db
    .update(noticeDeliveries)
    .set({ status: 'pending', attempts: 0, nextAttemptAt: at, claimedAt: null })
    .where(and(eq(noticeDeliveries.noticeId, noticeId), eq(noticeDeliveries.status, 'failed')))
    .run().changes;
  const queued = fresh.length + retried;
  if (queued > 0) deliveriesQueued();
  return queued;
}
