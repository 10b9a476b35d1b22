import { Router } from 'express';
import { z } from 'zod';

import {
  correctiveActionInputSchema,
  findingCloseInputSchema,
  findingReopenInputSchema,
  noticeListQuerySchema,
  noticePaperOf,
  type OutboxMessage,
} from '@/features/notices/schema';
import { nowOf, type ApiDeps } from '@/server/deps';
import { HttpError, notFound } from '@/server/http/errors';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import type { MailboxEntry } from '@/server/mail/mailbox';
import { requeueNotice } from '@/server/notices/deliveries';
import { cachedNoticePdf } from '@/server/notices/pdf/cache';
import { createNoticePdfPool, renderNoticePdfOffThread } from '@/server/notices/pdf/render-off-thread';
import { reportCorrectiveAction } from '@/server/notices/corrective-action';
import { acknowledgeNotice, getNotice, listNotices, mustSeeNotice } from '@/server/notices/read';
import { closeFinding, reopenFinding } from '@/server/review/finding-verdict';
import { storageOf } from '@/server/storage';

const id = z.string().trim().min(1).max(64);
const byId = validate({ params: z.object({ id }) });
const listInput = validate({ query: noticeListQuerySchema });
const pdfInput = validate({
  params: z.object({ id }),
  query: z.object({
    // Without a size, the paper the notice was issued on (its company's choice, frozen with it).
    size: z
      .enum(['A4', 'LETTER', 'a4', 'letter'], { error: 'A4 or LETTER' })
      .optional()
      .transform((s) => s?.toUpperCase() as 'A4' | 'LETTER' | undefined),
  }),
});
const actionInput = validate({ params: z.object({ id }), body: correctiveActionInputSchema });
const closeInput = validate({ params: z.object({ id }), body: findingCloseInputSchema });
const reopenInput = validate({ params: z.object({ id }), body: findingReopenInputSchema });
const attachmentInput = validate({
  params: z.object({
    id,
    index: z.coerce.number({ error: 'Must be a whole number' }).int('Must be a whole number').min(0),
  }),
});

const outboxEntry = (m: MailboxEntry): OutboxMessage => ({
  id: m.id,
  receivedAt: m.receivedAt,
  from: m.from,
  to: m.to,
  subject: m.subject,
  messageId: m.messageId,
  idempotencyKey: m.idempotencyKey,
  size: m.size,
  attachments: m.attachments,
});

/** A file name safe in a Content-Disposition header (our references are; this keeps it so). */
const safeFileName = (name: string) => name.replace(/[^\w.-]+/g, '_');

/**
 * Notices to operators, the corrective-action loop on their findings, and the admin's outbox.
 *
 * - `GET /notices?rideId=&operatorId=&page=&pageSize=` → `{ notices, total, page, pageSize }`, newest
 *   first; operators get their own company's only
 * - `GET /notices/:id` → `{ notice }`: the frozen document, acknowledgement, deliveries, and the notice's
 *   findings as they stand now with their corrective actions; another company's operator gets 404
 * - `GET /notices/:id/pdf?size=A4|LETTER` → the notice as a PDF (same access), on the paper it was issued
 *   on unless `size` asks for the other
 * - `POST /notices/:id/acknowledge` (operator of the company) → `{ notice }`; recorded once, a repeat
 *   answers the same
 * - `POST /notices/:id/resend` (supervisor, admin) → `{ queued }`: e-mails the notice to addresses that
 *   have not had it (added since, or after a failure); never twice to one address
 * - `POST /findings/:id/actions` (operator) `{ note, photoShas }` → 201 finding state; photos must be
 *   uploaded first (400 naming `photoShas.N`), 409 on a closed finding
 * - `POST /findings/:id/close` `{ note, photoShas?, evidenceRef? }` (supervisor, admin, inspector) → finding
 *   state; the note and evidence (photos, a document reference, or the operator's corrective-action report
 *   on record) are required (400 naming `note` / `evidence`); the ride's status never changes here, the
 *   last blocking finding closed on a stopped ride books its follow-up inspection
 * - `POST /findings/:id/reopen` `{ note }` (same roles) → finding state; a blocking finding reopened on a
 *   ride in service stops it, with the status notice
 * - `GET /admin/outbox`, `GET /admin/outbox/:id`, `GET /admin/outbox/:id/attachments/:index` (admin): the
 *   local mailbox; 404 `no_local_mailbox` when e-mail goes to a real SMTP server
 */
export function noticesRouter(deps: ApiDeps): Router {
  const router = Router();
  const pdfPool = createNoticePdfPool();
  const signedIn = requireAuth(deps);
  const operator = [signedIn, requireRole('operator')];
  const verifiers = [signedIn, requireRole('supervisor', 'admin', 'inspector')];
  const planners = [signedIn, requireRole('supervisor', 'admin')];
  const admin = [signedIn, requireRole('admin')];
  const ctx = () => ({ now: nowOf(deps), appUrl: deps.config.appUrl });

  router.get('/notices', signedIn, listInput, (_req, res) => {
    res.json(listNotices(deps.db, currentUser(res), listInput.query(res)));
  });

  router.get('/notices/:id', signedIn, byId, (_req, res) => {
    res.json({ notice: getNotice(deps.db, currentUser(res), byId.params(res).id) });
  });

  router.get('/notices/:id/pdf', signedIn, pdfInput, async (_req, res) => {
    const { id, document } = mustSeeNotice(deps.db, currentUser(res), pdfInput.params(res).id);
    const pageSize = pdfInput.query(res).size ?? noticePaperOf(document);
    // Drawn once per notice, paper size and content in a worker thread, then read from the storage.
    const storage = storageOf(deps.config);
    const { pdf } = await cachedNoticePdf(deps.db, storage, { id, document, pageSize }, () =>
      renderNoticePdfOffThread(pdfPool, deps.db, storage, document, pageSize),
    );
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${safeFileName(document.reference)}.pdf"`);
    res.setHeader('Cache-Control', 'private, no-cache');
    res.send(pdf);
  });

  router.post('/notices/:id/acknowledge', ...operator, byId, (_req, res) => {
    res.json({ notice: acknowledgeNotice(deps.db, currentUser(res), byId.params(res).id, nowOf(deps)) });
  });

  router.post('/notices/:id/resend', ...planners, byId, (_req, res) => {
    const { id: noticeId } = byId.params(res);
    mustSeeNotice(deps.db, currentUser(res), noticeId);
    const queued = deps.db.transaction((tx) => requeueNotice(tx, noticeId, nowOf(deps)));
    res.json({ queued });
  });

  router.post('/findings/:id/actions', ...operator, actionInput, (_req, res) => {
    const result = reportCorrectiveAction(
      deps.db,
      currentUser(res),
      actionInput.params(res).id,
      actionInput.body(res),
      nowOf(deps),
    );
    res.status(201).json(result);
  });

  router.post('/findings/:id/close', ...verifiers, closeInput, (_req, res) => {
    res.json(closeFinding(deps.db, currentUser(res), closeInput.params(res).id, closeInput.body(res), ctx()));
  });

  router.post('/findings/:id/reopen', ...verifiers, reopenInput, (_req, res) => {
    res.json(
      reopenFinding(deps.db, currentUser(res), reopenInput.params(res).id, reopenInput.body(res).note, ctx()),
    );
  });

  const mailbox = () => {
    const fake = deps.mail?.fake;
    if (!fake)
      throw new HttpError(
        404,
        'no_local_mailbox',
        'E-mail goes out through the SMTP server set in SMTP_URL, so there is no local outbox to show; ' +
          'look in that server’s own logs.',
      );
    return fake;
  };

  router.get('/admin/outbox', ...admin, (_req, res) => {
    res.json({ messages: mailbox().list().map(outboxEntry) });
  });

  router.get('/admin/outbox/:id', ...admin, byId, async (_req, res) => {
    const message = await mailbox().get(byId.params(res).id);
    if (!message) throw notFound('No such message in the outbox.');
    const { attachments, text, html, ...rest } = message;
    res.json({
      message: {
        ...outboxEntry({ ...rest, attachments: attachments.map(({ content: _, ...a }) => a) }),
        text,
        html,
      },
    });
  });

  router.get('/admin/outbox/:id/attachments/:index', ...admin, attachmentInput, async (_req, res) => {
    const { id: messageId, index } = attachmentInput.params(res);
    const attachment = await mailbox().attachment(messageId, index);
    if (!attachment) throw notFound('No such attachment in the outbox.');
    res.setHeader('Content-Type', attachment.contentType);
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="${safeFileName(attachment.filename ?? `attachment-${index + 1}`)}"`,
    );
    res.setHeader('Cache-Control', 'private, no-store');
    res.send(attachment.content);
  });

  return router;
}
