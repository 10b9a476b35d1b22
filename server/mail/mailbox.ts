/**
 * The local mailbox behind the fake SMTP server: every accepted message is kept as its raw `.eml` plus
 * one entry in `index.json`, so the outbox survives restarts and shows exactly the bytes that went over
 * the wire. The index is rewritten whole (temp file + rename) after the `.eml` is on disk, so the rename
 * is the commit point: an `.eml` without an index entry was never acknowledged to the client (which will
 * send it again) and is removed at open.
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import { simpleParser, type AddressObject, type ParsedMail } from 'mailparser';

/** The header that carries a message's idempotency key (set by server/mail/mailer.ts). */
export const idempotencyKeyHeader = 'X-Pivotwatch-Key';

export type MailboxAttachmentSummary = {
  /** Position among the message's attachments, for `attachment(id, index)`. */
  index: number;
  filename: string | null;
  contentType: string;
  /** Decoded size in bytes. */
  size: number;
};

export type MailboxEntry = {
  id: string;
  /** ISO time the fake server accepted the message. */
  receivedAt: string;
  /** The SMTP envelope: who the client said it sends for and to (only recipients not already holding it). */
  envelope: { from: string; to: string[] };
  /** The From header as written. */
  from: string;
  /** Addresses in the To and Cc headers. */
  to: string[];
  subject: string;
  messageId: string | null;
  idempotencyKey: string | null;
  /** Size of the raw message in bytes. */
  size: number;
  attachments: MailboxAttachmentSummary[];
};

export type MailboxAttachment = MailboxAttachmentSummary & { content: Buffer };

export type MailboxMessage = Omit<MailboxEntry, 'attachments'> & {
  text: string | null;
  html: string | null;
  attachments: MailboxAttachment[];
};

export type StoreResult =
  | { status: 'stored'; entry: MailboxEntry }
  /** Every envelope recipient already holds a message with this idempotency key; nothing was written. */
  | { status: 'duplicate'; key: string };

export type Mailbox = {
  dir: string;
  /** Newest first. */
  list: () => MailboxEntry[];
  get: (id: string) => Promise<MailboxMessage | null>;
  attachment: (id: string, index: number) => Promise<MailboxAttachment | null>;
  /** The raw message as received, or null. */
  raw: (id: string) => Buffer | null;
  /** Whether a message with this key was already delivered to this recipient. */
  holds: (key: string, recipient: string) => boolean;
  store: (raw: Buffer, envelope: { from: string; to: string[] }) => Promise<StoreResult>;
  clear: () => void;
};

type IndexFile = { version: 1; messages: MailboxEntry[] };

const indexName = 'index.json';

const normalizeAddress = (address: string) => address.trim().toLowerCase();
const dedupeKey = (key: string, recipient: string) => `${key}\n${normalizeAddress(recipient)}`;

function addressesOf(field: AddressObject | AddressObject[] | undefined): string[] {
  if (!field) return [];
  const objects = Array.isArray(field) ? field : [field];
  return objects.flatMap((o) => o.value.flatMap((a) => (a.address ? [a.address] : [])));
}

function headerText(parsed: ParsedMail, name: string): string | null {
  const value = parsed.headers.get(name.toLowerCase());
  return typeof value === 'string' && value.trim() !== '' ? value.trim() : null;
}

function summarise(parsed: ParsedMail): MailboxAttachmentSummary[] {
  return parsed.attachments.map((a, index) => ({
    index,
    filename: a.filename ?? null,
    contentType: a.contentType,
    size: a.content.length,
  }));
}

function writeAtomic(file: string, data: string | Buffer) {
  const tmp = `${file}.${process.pid}.tmp`;
  fs.writeFileSync(tmp, data);
  fs.renameSync(tmp, file);
}

/** Opens (creating when missing) the mailbox kept in `dir`. */
export function openMailbox(dir: string): Mailbox {
  fs.mkdirSync(dir, { recursive: true });
  const indexFile = path.join(dir, indexName);
  let messages: MailboxEntry[] = [];
  if (fs.existsSync(indexFile)) {
    const parsed = JSON.parse(fs.readFileSync(indexFile, 'utf8')) as IndexFile;
    if (parsed.version !== 1 || !Array.isArray(parsed.messages)) {
      throw new Error(`${indexFile} is not a mailbox index this version understands`);
    }
    messages = parsed.messages;
  }
  const byId = new Map(messages.map((m) => [m.id, m]));
  const held = new Set<string>();
  const remember = (entry: MailboxEntry) => {
    if (!entry.idempotencyKey) return;
    for (const rcpt of entry.envelope.to) held.add(dedupeKey(entry.idempotencyKey, rcpt));
  };
  messages.forEach(remember);

  // Never acknowledged (see the file comment); stale temp files likewise.
  for (const name of fs.readdirSync(dir)) {
    const orphanEml = name.endsWith('.eml') && !byId.has(name.slice(0, -'.eml'.length));
    if (orphanEml || name.endsWith('.tmp')) fs.rmSync(path.join(dir, name), { force: true });
  }

  const emlFile = (id: string) => path.join(dir, `${id}.eml`);
  const saveIndex = () =>
    writeAtomic(indexFile, JSON.stringify({ version: 1, messages } satisfies IndexFile));

  // Only ids the index knows are ever turned into paths, so an id from a URL cannot leave `dir`.
  const raw = (id: string): Buffer | null => (byId.has(id) ? fs.readFileSync(emlFile(id)) : null);

  const get = async (id: string): Promise<MailboxMessage | null> => {
    const entry = byId.get(id);
    const bytes = raw(id);
    if (!entry || !bytes) return null;
    const parsed = await simpleParser(bytes);
    return {
      ...entry,
      text: parsed.text ?? null,
      html: typeof parsed.html === 'string' ? parsed.html : null,
      attachments: parsed.attachments.map((a, index) => ({
        index,
        filename: a.filename ?? null,
        contentType: a.contentType,
        size: a.content.length,
        content: a.content,
      })),
    };
  };

  return {
    dir,
    list: () => [...messages].reverse(),
    get,
    attachment: async (id, index) => (await get(id))?.attachments[index] ?? null,
    raw,
    holds: (key, recipient) => held.has(dedupeKey(key, recipient)),
    store: async (bytes, envelope) => {
      const parsed = await simpleParser(bytes);
      const key = headerText(parsed, idempotencyKeyHeader);
      // From here to the index write everything is synchronous, so two deliveries of the same key racing
      // each other cannot both pass the check.
      const fresh = key ? envelope.to.filter((rcpt) => !held.has(dedupeKey(key, rcpt))) : envelope.to;
      if (key && fresh.length === 0) return { status: 'duplicate', key };

      const entry: MailboxEntry = {
        id: randomUUID(),
        receivedAt: new Date().toISOString(),
        envelope: { from: envelope.from, to: fresh },
        from: parsed.from?.text ?? '',
        to: [...addressesOf(parsed.to), ...addressesOf(parsed.cc)],
        subject: parsed.subject ?? '',
        messageId: parsed.messageId ?? null,
        idempotencyKey: key,
        size: bytes.length,
        attachments: summarise(parsed),
      };
      writeAtomic(emlFile(entry.id), bytes);
      messages.push(entry);
      byId.set(entry.id, entry);
      try {
        saveIndex();
      } catch (error) {
        messages.pop();
        byId.delete(entry.id);
        fs.rmSync(emlFile(entry.id), { force: true });
        throw error;
      }
      remember(entry);
      return { status: 'stored', entry };
    },
    clear: () => {
      for (const m of messages) fs.rmSync(emlFile(m.id), { force: true });
      messages = [];
      byId.clear();
      held.clear();
      saveIndex();
    },
  };
}
