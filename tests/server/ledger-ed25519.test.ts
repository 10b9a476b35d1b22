/**
 * The server's Ed25519 (Node's crypto, server/ledger/ed25519.ts) against RFC 8032 section 7.1's test
 * vectors TEST 1 to 3, and against @noble/curves (the phone's) on keys and messages of its own: the two
 * must give the same signatures, since a phone signs what the server checks and the server signs what any
 * verifier checks.
 */
import { keyIdOf, newPrivateKey, nobleEd25519, publicKeyOf, sha256Hex } from '@/features/ledger';
import { nodeEd25519 } from '@/server/ledger/ed25519';
import { rfc8032Vectors } from '@/tests/support/rfc8032-vectors';

test.each(rfc8032Vectors)('$name: Node signs and verifies as RFC 8032 prints', (v) => {
  expect(nodeEd25519.sign(v.secret, v.message)).toBe(v.signature);
  expect(nodeEd25519.verify(v.public, v.message, v.signature)).toBe(true);
  const flipped = v.signature.slice(0, -1) + (parseInt(v.signature.slice(-1), 16) ^ 1).toString(16);
  expect(nodeEd25519.verify(v.public, v.message, flipped)).toBe(false);
});

test('malformed keys, messages or signatures are false, never a throw', () => {
  const v = rfc8032Vectors[1];
  expect(nodeEd25519.verify('zz', v.message, v.signature)).toBe(false);
  expect(nodeEd25519.verify(v.public, 'abc', v.signature)).toBe(false);
  expect(nodeEd25519.verify(v.public, v.message, v.signature.slice(2))).toBe(false);
  expect(() => nodeEd25519.sign('12', v.message)).toThrow(/32 bytes/);
});

test('Node and @noble/curves agree on fresh keys and record hashes', () => {
  for (let i = 0; i < 20; i += 1) {
    const secret = newPrivateKey();
    const pub = publicKeyOf(secret);
    const message = sha256Hex(`record ${i} ${keyIdOf(pub)}`);
    const byNode = nodeEd25519.sign(secret, message);
    expect(nobleEd25519.sign(secret, message)).toBe(byNode);
    expect(nobleEd25519.verify(pub, message, byNode)).toBe(true);
    expect(nodeEd25519.verify(pub, message, nobleEd25519.sign(secret, message))).toBe(true);
  }
});
