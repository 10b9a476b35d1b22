/**
 * A real SMTP server on loopback that keeps every message it accepts (server/mail/mailbox.ts), used in
 * development, the demo and tests in place of a hosted mail service. Plain SMTP only (no STARTTLS: nothing
 * leaves the machine), AUTH accepted but not required, so any SMTP_URL shape a deployment uses works here.
 *
 * Unlike a real server it drops a message whose idempotency key a recipient already holds, so a retry after
 * a lost reply shows up as one message, and it can be told to fail the next transactions for tests.
 */
import { isIP, type Socket } from 'node:net';

import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';

import type { Logger } from '@/server/logger';
import { openMailbox, type Mailbox } from '@/server/mail/mailbox';

/** Answer a transaction with an SMTP error: at MAIL FROM, at every RCPT TO, or after the message data. */
export type SmtpReplyFault = { code: number; when: 'mail' | 'rcpt' | 'data'; message?: string };
/**
 * Cut the connection: `data` part-way through the message (nothing is kept); `after-accept` once the
 * message is kept but before the 250 reply, the case where the client cannot know it was delivered.
 */
export type SmtpDropFault = { when: 'data' | 'after-accept' };
type Fault = ({ kind: 'reply' } & SmtpReplyFault) | ({ kind: 'drop' } & SmtpDropFault);

type FakeSmtpOptions = {
  /** Must be a loopback address; default 127.0.0.1. */
  host?: string;
  /** 0 (the default) picks a free port. */
  port?: number;
  /** Where the mailbox lives, e.g. DATA_DIR/mailbox. */
  dir: string;
  logger?: Logger;
  /** Largest message accepted, in bytes; default 25 MB. */
  maxMessageBytes?: number;
};

export type FakeSmtp = Pick<Mailbox, 'list' | 'get' | 'attachment' | 'raw' | 'clear'> & {
  host: string;
  port: number;
  /** `smtp://host:port`, for createMailer. */
  url: string;
  mailbox: Mailbox;
  /** Answer the next `n` transactions with an SMTP error (4xx transient, 5xx permanent). */
  failNext: (n: number, fault: SmtpReplyFault) => void;
  /** Cut the connection in the next `n` transactions. */
  dropNext: (n: number, fault: SmtpDropFault) => void;
  /** Faults queued and not yet used. */
  pendingFaults: () => number;
  /** Counters since start: messages kept, duplicates dropped, transactions failed or cut on purpose. */
  stats: () => { stored: number; duplicates: number; faults: number };
  /** Stops listening and cuts open connections. Idempotent. */
  close: () => Promise<void>;
};

const isLoopback = (host: string) =>
  host === 'localhost' || host === '::1' || (isIP(host) === 4 && host.startsWith('127.'));

const smtpError = (code: number, message: string) =>
  Object.assign(new Error(message), { responseCode: code });

type DataContext = {
  /** The fault this transaction picked, if any. */
  fault: Fault | undefined;
  mailbox: Mailbox;
  stats: { stored: number; duplicates: number; faults: number };
  log: Logger | undefined;
  /** Cuts this transaction's connection. */
  cut: () => void;
};

/** Reads a message's data and keeps it in the mailbox, unless the transaction's fault says otherwise. */
function keepMessage(
  stream: SMTPServerDataStream,
  session: SMTPServerSession,
  callback: (err?: Error | null, message?: string) => void,
  ctx: DataContext,
) {
  const { fault } = ctx;
  const chunks: Buffer[] = [];
  // A cut connection destroys the stream with an error; without a listener that would crash the process.
  stream.on('error', () => undefined);
  stream.on('data', (chunk: Buffer) => {
    chunks.push(chunk);
    if (fault?.kind === 'drop' && fault.when === 'data') ctx.cut();
  });
  stream.on('end', () => {
    if (fault?.kind === 'drop' && fault.when === 'data') return;
    if (stream.sizeExceeded) return callback(smtpError(552, 'Message too big'));
    if (fault?.kind === 'reply' && fault.when === 'data') {
      return callback(smtpError(fault.code, fault.message ?? 'Message refused (fault injected)'));
    }
    const envelope = {
      from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
      to: session.envelope.rcptTo.map((r) => r.address),
    };
    ctx.mailbox.store(Buffer.concat(chunks), envelope).then(
      (result) => {
        if (result.status === 'stored') {
          ctx.stats.stored += 1;
          ctx.log?.info({ id: result.entry.id, to: result.entry.envelope.to }, 'kept a message');
        } else {
          ctx.stats.duplicates += 1;
          ctx.log?.info({ key: result.key }, 'dropped a message every recipient already holds');
        }
        if (fault?.kind === 'drop' && fault.when === 'after-accept') {
          ctx.cut();
          return callback();
        }
        // A duplicate still gets 250: the client did its job, the recipient already has the message.
        callback(
          null,
          result.status === 'stored' ? `OK: kept as ${result.entry.id}` : 'OK: already delivered',
        );
      },
      (error: unknown) => {
        ctx.log?.error({ err: error }, 'could not keep a message');
        callback(smtpError(451, 'Could not store the message, try again later'));
      },
    );
  });
}

export async function startFakeSmtp(opts: FakeSmtpOptions): Promise<FakeSmtp> {
  const host = opts.host ?? '127.0.0.1';
  if (!isLoopback(host)) {
    throw new Error(`The fake SMTP server listens on loopback only; ${host} is not a loopback address.`);
  }
  const mailbox = openMailbox(opts.dir);
  const log = opts.logger?.child({ component: 'fake-smtp' });

  const queue: Fault[] = [];
  /** The fault picked for a transaction, by `session.id:transaction`. */
  const active = new Map<string, Fault>();
  const tx = (session: SMTPServerSession) => `${session.id}:${session.transaction}`;
  /** Client sockets by remote port (all loopback), so a fault can cut one. */
  const sockets = new Map<number, Socket>();
  const stats = { stored: 0, duplicates: 0, faults: 0 };

  const takeFault = (session: SMTPServerSession) => {
    const fault = queue.shift();
    if (fault) {
      active.set(tx(session), fault);
      stats.faults += 1;
    }
    return fault;
  };
  const cut = (session: SMTPServerSession) => sockets.get(session.remotePort)?.destroy();

  const server = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    hideSTARTTLS: true,
    authOptional: true,
    allowInsecureAuth: true,
    size: opts.maxMessageBytes ?? 25 * 1024 * 1024,
    banner: 'Pivotwatch local mailbox (nothing leaves this machine)',
    logger: false,
    closeTimeout: 1000,
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username ?? 'anonymous' }),
    onMailFrom: (_address, session, callback) => {
      const fault = takeFault(session);
      if (fault?.kind === 'reply' && fault.when === 'mail') {
        active.delete(tx(session));
        return callback(smtpError(fault.code, fault.message ?? 'Sender refused (fault injected)'));
      }
      callback();
    },
    onRcptTo: (_address, session, callback) => {
      const fault = active.get(tx(session));
      if (fault?.kind === 'reply' && fault.when === 'rcpt') {
        return callback(smtpError(fault.code, fault.message ?? 'Recipient refused (fault injected)'));
      }
      callback();
    },
    onClose: (session) => {
      // A transaction given up before DATA (a refused RCPT, a reset) leaves its fault here.
      for (const key of active.keys()) if (key.startsWith(`${session.id}:`)) active.delete(key);
    },
    onData: (stream, session, callback) => {
      const key = tx(session);
      const fault = active.get(key);
      active.delete(key);
      keepMessage(stream, session, callback, { fault, mailbox, stats, log, cut: () => cut(session) });
    },
  });
  server.on('error', (error) => log?.warn({ err: error }, 'SMTP session error'));
  server.server.on('connection', (socket: Socket) => {
    const port = socket.remotePort;
    if (port === undefined) return;
    sockets.set(port, socket);
    socket.once('close', () => sockets.delete(port));
  });

  await new Promise<void>((resolve, reject) => {
    server.server.once('error', reject);
    server.listen(opts.port ?? 0, host, () => {
      server.server.off('error', reject);
      resolve();
    });
  });
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  const urlHost = isIP(host) === 6 ? `[${host}]` : host;

  let closing: Promise<void> | undefined;
  const queueFaults = (n: number, fault: Fault) => {
    if (!Number.isInteger(n) || n < 0) throw new Error('n must be a whole number of transactions');
    for (let i = 0; i < n; i++) queue.push(fault);
  };

  return {
    host,
    port,
    url: `smtp://${urlHost}:${port}`,
    mailbox,
    list: mailbox.list,
    get: mailbox.get,
    attachment: mailbox.attachment,
    raw: mailbox.raw,
    clear: mailbox.clear,
    failNext: (n, fault) => {
      if (!Number.isInteger(fault.code) || fault.code < 400 || fault.code > 599) {
        throw new Error('A fault code must be an SMTP error reply, 400–599');
      }
      queueFaults(n, { kind: 'reply', ...fault });
    },
    dropNext: (n, fault) => queueFaults(n, { kind: 'drop', ...fault }),
    pendingFaults: () => queue.length,
    stats: () => ({ ...stats }),
    close: () => {
      closing ??= new Promise<void>((resolve) => {
        server.close(() => resolve());
        for (const socket of sockets.values()) socket.destroy();
      });
      return closing;
    },
  };
}
