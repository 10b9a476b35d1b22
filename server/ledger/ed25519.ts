import { createPrivateKey, createPublicKey, sign, verify, type KeyObject } from 'node:crypto';

import type { Ed25519Ops } from '@/features/ledger';

/*
 * Ed25519 through Node's crypto (OpenSSL): the server signs an entry per accepted record and checks every
 * signature of a ride's chain, where @noble/curves (the phone's) would take about 0.4 ms a signature and
 * 1 ms a check. Keys arrive as the chain stores them, raw hex; DER wraps them for Node (RFC 8410: PKCS #8
 * for the 32-byte private seed, SubjectPublicKeyInfo for the 32-byte public key).
 */
const PKCS8_PREFIX = '302e020100300506032b657004220420';
const SPKI_PREFIX = '302a300506032b6570032100';
const HEX_32 = /^[0-9a-f]{64}$/i;
const HEX_64 = /^[0-9a-f]{128}$/i;

const privateKeys = new Map<string, KeyObject>();
const publicKeys = new Map<string, KeyObject>();

function privateKeyOf(hex: string): KeyObject {
  let key = privateKeys.get(hex);
  if (!key) {
    if (!HEX_32.test(hex)) throw new Error('An Ed25519 private key is 32 bytes in hex.');
    key = createPrivateKey({ key: Buffer.from(PKCS8_PREFIX + hex, 'hex'), format: 'der', type: 'pkcs8' });
    privateKeys.set(hex, key);
  }
  return key;
}

function publicKeyOf(hex: string): KeyObject | null {
  let key = publicKeys.get(hex);
  if (!key) {
    if (!HEX_32.test(hex)) return null;
    try {
      key = createPublicKey({ key: Buffer.from(SPKI_PREFIX + hex, 'hex'), format: 'der', type: 'spki' });
    } catch {
      return null;
    }
    // A server sees few keys (its own and its phones'); the cache stays small.
    if (publicKeys.size > 10_000) publicKeys.clear();
    publicKeys.set(hex, key);
  }
  return key;
}

export const nodeEd25519: Ed25519Ops = {
  sign: (privateKeyHex, messageHex) =>
    sign(null, Buffer.from(messageHex, 'hex'), privateKeyOf(privateKeyHex)).toString('hex'),
  verify: (publicKeyHex, messageHex, signatureHex) => {
    const key = publicKeyOf(publicKeyHex);
    if (!key || !HEX_64.test(signatureHex) || !/^(?:[0-9a-f]{2})*$/i.test(messageHex)) return false;
    try {
      return verify(null, Buffer.from(messageHex, 'hex'), key, Buffer.from(signatureHex, 'hex'));
    } catch {
      return false;
    }
  },
};
