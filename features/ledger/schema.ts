/** The record chain's vocabulary, shared by the database schema, the server and the app. */
import { z } from 'zod';

/** What the chain records: an inspection or amendment as accepted, a decision, a finding, an NDT record, a notice. */
export const ledgerKinds = ['inspection', 'amendment', 'decision', 'finding', 'ndt', 'notice'] as const;
export type LedgerKind = (typeof ledgerKinds)[number];

/** Why a chain is broken at an entry, in the order they are checked. */
export const breakReasons = [
  'missing',
  'order',
  'altered',
  'countersignature',
  'device_signature',
  'head',
  'live_differs',
] as const;
export type BreakReason = (typeof breakReasons)[number];

export type ChainBreak = { seq: number; kind: LedgerKind | null; refId: string | null; why: BreakReason };

/** The answer of GET /api/rides/:id/chain/verify. */
export const chainVerificationSchema = z.object({
  rideId: z.string(),
  intact: z.boolean(),
  entries: z.number().int(),
  checkedAt: z.string(),
  break: z
    .object({
      seq: z.number().int(),
      kind: z.enum(ledgerKinds).nullable(),
      refId: z.string().nullable(),
      why: z.enum(breakReasons),
      words: z.string(),
    })
    .nullable(),
  /** The phone keys whose signatures the chain carries: how many records each signed, named by its owner. */
  signers: z.array(
    z.object({
      keyId: z.string(),
      personName: z.string(),
      records: z.number().int(),
      revokedAt: z.string().nullable(),
    }),
  ),
  /** Entries no phone signed: the server's own (decisions, findings, NDT records, notices) and older records. */
  unsigned: z.number().int(),
});
export type ChainVerification = z.infer<typeof chainVerificationSchema>;

/** The result in one plain sentence, for the app and the notice's reader. */
export function chainVerdictText(v: ChainVerification): string {
  if (v.intact)
    return v.entries === 0
      ? 'Nothing recorded in the chain for this ride yet.'
      : `Intact: all ${v.entries} recorded ${v.entries === 1 ? 'change matches' : 'changes match'} what the ` +
          'server accepted, in order, each countersigned.';
  const b = v.break;
  if (!b) return 'Broken.';
  const what = b.kind ? `entry ${b.seq} (${kindWords[b.kind]})` : `entry ${b.seq}`;
  return `Broken at ${what}: ${b.words}.`;
}

/** What a check proves and what it does not, shown beside every result. */
export const chainCaveat =
  'An intact chain shows that the records kept for this ride are the ones the server accepted, unchanged and ' +
  'in order. It does not show that what was entered was true, and it cannot speak for records kept elsewhere.';

/** The plain words for a break, for the app and the API's answer. */
export const breakWords: Record<BreakReason, string> = {
  missing: 'an entry is missing here: the sequence jumps over it or was cut short',
  order: 'the order was changed: this entry does not follow the one stored before it',
  altered: 'this entry was altered after it was written: its content no longer gives its hash',
  countersignature: "the server's countersignature on this entry does not verify",
  device_signature: "the phone's signature on this record does not verify",
  head: "the chain's end is not the end the server signed: entries were added or removed there",
  live_differs: 'the record as it stands now differs from what was accepted',
};

export const kindWords: Record<LedgerKind, string> = {
  inspection: 'inspection',
  amendment: 'amendment',
  decision: 'decision',
  finding: 'finding',
  ndt: 'NDT record',
  notice: 'notice',
};

// ——— phone keys ———

/** An Ed25519 public key (32 bytes) or signature (64 bytes), lowercase hex as the chain stores them. */
export const publicKeyHexSchema = z
  .string()
  .regex(/^[0-9a-f]{64}$/, 'An Ed25519 public key: 64 lowercase hex digits');

/** POST /api/devices/keys: the phone's public key for this sign-in and what the phone calls itself. */
export const registerDeviceKeyBodySchema = z.object({
  publicKey: publicKeyHexSchema,
  label: z.string().trim().min(1, 'Leave the label out rather than empty').max(80).optional(),
});
export type RegisterDeviceKeyBody = z.infer<typeof registerDeviceKeyBodySchema>;

/** The answer of POST /api/devices/keys (201 new, 200 already this person's). */
export const registeredDeviceKeySchema = z.object({ keyId: z.string(), createdAt: z.string() });

/** One of a person's phone keys, as GET /api/devices/keys lists them. */
export const deviceKeySchema = z.object({
  keyId: z.string(),
  label: z.string().nullable(),
  createdAt: z.string(),
  revokedAt: z.string().nullable(),
  revokedBy: z.string().nullable(),
});
export type DeviceKey = z.infer<typeof deviceKeySchema>;
