/**
 * Sends e-mail over SMTP with nodemailer. Every message carries an idempotency key: it becomes the
 * `X-Pivotwatch-Key` header and, hashed, a stable Message-ID, so a retried send is the same message to the
 * receiving side (our fake server drops it; mail clients thread or collapse it) rather than a new one.
 */
import { createHash } from 'node:crypto';

import nodemailer from 'nodemailer';

import type { Logger } from '@/server/logger';
import { idempotencyKeyHeader } from '@/server/mail/mailbox';

export type MailAttachment = {
  filename: string;
  content: Buffer | Uint8Array;
  contentType?: string;
};

export type OutgoingMail = {
  /** One address per idempotency key is the intended use (a delivery is one notice to one recipient). */
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: MailAttachment[];
  /** Extra headers; the idempotency header and Message-ID are set here and cannot be overridden. */
  headers?: Record<string, string>;
  replyTo?: string;
  /** Printable ASCII without spaces, 1–200 characters; see `deliveryKey`. */
  idempotencyKey: string;
};

export type SendResult = {
  messageId: string;
  /** Recipients the server accepted. */
  accepted: string[];
  /** Recipients the server refused while accepting others (a refusal of all of them throws). */
  rejected: string[];
  /** The server's final reply, e.g. `250 OK: queued as …`. */
  response: string;
};

export type Mailer = {
  send: (mail: OutgoingMail) => Promise<SendResult>;
  /** Connects and says hello (and authenticates when the URL has credentials); throws a MailSendError. */
  verify: () => Promise<void>;
  /** Where mail goes, without credentials, for logs. */
  target: string;
  close: () => void;
};

export type MailErrorKind = 'transient' | 'permanent';

/** What a failed send is, in a shape fit to store on a delivery row and show to an admin. */
export type MailErrorInfo = {
  kind: MailErrorKind;
  message: string;
  /** nodemailer's code (ECONNECTION, ETIMEDOUT, EENVELOPE, EMESSAGE, EAUTH, …) when it set one. */
  code: string | null;
  /** The SMTP reply code, when the server answered. */
  responseCode: number | null;
  /** The SMTP command that was refused. */
  command: string | null;
};

export class MailSendError extends Error {
  readonly info: MailErrorInfo;
  constructor(info: MailErrorInfo, options?: { cause?: unknown }) {
    super(info.message, options);
    this.name = 'MailSendError';
    this.info = info;
  }
  get kind(): MailErrorKind {
    return this.info.kind;
  }
}

/** Network failures: the server may well answer next time. */
const transientCodes = new Set([
  'ECONNECTION',
  'ETIMEDOUT',
  'ESOCKET',
  'EDNS',
  'EPROXY',
  'ETLS',
  'ECONNREFUSED',
  'ECONNRESET',
  'EPIPE',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'EAI_AGAIN',
]);

const field = (error: unknown, name: string): unknown =>
  typeof error === 'object' && error !== null && name in error
    ? (error as Record<string, unknown>)[name]
    : undefined;
const stringField = (error: unknown, name: string) => {
  const v = field(error, name);
  return typeof v === 'string' ? v : null;
};
const numberField = (error: unknown, name: string) => {
  const v = field(error, name);
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
};

/**
 * Transient or permanent, by the SMTP reply class when the server answered (4yz transient, 5yz permanent,
 * RFC 5321 §4.2.1), otherwise by whether the connection failed. Anything unrecognised is permanent: it is
 * a configuration or programming problem that retrying would only repeat.
 */
export function classifyMailError(error: unknown): MailErrorKind {
  if (error instanceof MailSendError) return error.kind;
  const responseCode = numberField(error, 'responseCode');
  if (responseCode !== null && responseCode >= 400 && responseCode < 600) {
    return responseCode < 500 ? 'transient' : 'permanent';
  }
  const codes = [stringField(error, 'code'), stringField(error, 'originalCode')];
  return codes.some((c) => c !== null && transientCodes.has(c)) ? 'transient' : 'permanent';
}

export function describeMailError(error: unknown): MailErrorInfo {
  if (error instanceof MailSendError) return error.info;
  return {
    kind: classifyMailError(error),
    message: error instanceof Error ? error.message : String(error),
    code: stringField(error, 'code'),
    responseCode: numberField(error, 'responseCode'),
    command: stringField(error, 'command'),
  };
}

const keyPattern = /^[\x21-\x7e]{1,200}$/;

/** The Message-ID a key always produces: a hash, so any printable key makes a valid `id-left`. */
export function messageIdFor(idempotencyKey: string, domain: string): string {
  const digest = createHash('sha256').update(idempotencyKey).digest('hex').slice(0, 40);
  return `<pw.${digest}@${domain}>`;
}

/**
 * A key for one notice to one recipient: the notice id and a hash of the lower-cased address, so the key
 * (which travels in a header) does not spell out the address and the same notice re-sent to a person
 * after a correction of case is still recognised.
 */
export function deliveryKey(noticeId: string, recipient: string): string {
  const who = createHash('sha256').update(recipient.trim().toLowerCase()).digest('hex').slice(0, 24);
  return `notice.${noticeId}.${who}`;
}

/** The domain of the From address, for Message-IDs; `pivotwatch.invalid` when there is none. */
function domainOf(from: string): string {
  const match = /@([^\s<>@]+?)>?\s*$/.exec(from);
  return match ? match[1].toLowerCase() : 'pivotwatch.invalid';
}

function withoutCredentials(smtpUrl: string): string {
  try {
    const url = new URL(smtpUrl);
    url.username = '';
    url.password = '';
    return url.toString().replace(/\/$/, '');
  } catch {
    return '(unparseable SMTP URL)';
  }
}

const addressText = (a: unknown): string =>
  typeof a === 'string' ? a : (stringField(a, 'address') ?? JSON.stringify(a));

type MailerOptions = {
  smtpUrl: string;
  from: string;
  logger?: Logger;
  /**
   * Upper bounds so a hung server cannot hold a delivery in `sending` for long (see deliver.ts). The
   * defaults keep one attempt under about two minutes.
   */
  timeouts?: { connectionMs?: number; greetingMs?: number; socketMs?: number };
};

export function createMailer(opts: MailerOptions): Mailer {
  const log = opts.logger?.child({ component: 'mailer' });
  const domain = domainOf(opts.from);
  const transport = nodemailer.createTransport({
    url: opts.smtpUrl,
    connectionTimeout: opts.timeouts?.connectionMs ?? 30_000,
    greetingTimeout: opts.timeouts?.greetingMs ?? 30_000,
    socketTimeout: opts.timeouts?.socketMs ?? 60_000,
    // Attachments are always bytes we hand over; never let a message read a file or fetch a URL.
    disableFileAccess: true,
    disableUrlAccess: true,
  });
  const target = withoutCredentials(opts.smtpUrl);

  const send = async (mail: OutgoingMail): Promise<SendResult> => {
    if (!keyPattern.test(mail.idempotencyKey)) {
      throw new MailSendError({
        kind: 'permanent',
        message: 'An idempotency key must be 1–200 printable ASCII characters without spaces.',
        code: 'EKEY',
        responseCode: null,
        command: null,
      });
    }
    const messageId = messageIdFor(mail.idempotencyKey, domain);
    try {
      const info = await transport.sendMail({
        from: opts.from,
        to: mail.to,
        replyTo: mail.replyTo,
        subject: mail.subject,
        text: mail.text,
        html: mail.html,
        attachments: mail.attachments?.map((a) => ({
          filename: a.filename,
          content: Buffer.isBuffer(a.content)
            ? a.content
            : Buffer.from(a.content.buffer, a.content.byteOffset, a.content.byteLength),
          contentType: a.contentType,
        })),
        headers: { ...mail.headers, [idempotencyKeyHeader]: mail.idempotencyKey },
        messageId,
      });
      const result: SendResult = {
        messageId,
        accepted: info.accepted.map(addressText),
        rejected: info.rejected.map(addressText),
        response: info.response,
      };
      log?.info(
        { messageId, key: mail.idempotencyKey, accepted: result.accepted, rejected: result.rejected },
        'mail accepted by the SMTP server',
      );
      return result;
    } catch (error) {
      const info = describeMailError(error);
      log?.warn({ messageId, key: mail.idempotencyKey, target, error: info }, 'mail not sent');
      throw new MailSendError(info, { cause: error });
    }
  };

  return {
    send,
    verify: async () => {
      try {
        await transport.verify();
      } catch (error) {
        throw new MailSendError(describeMailError(error), { cause: error });
      }
    },
    target,
    close: () => transport.close(),
  };
}
