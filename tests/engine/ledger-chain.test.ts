/**
 * The record chain's engine against the standards it rests on: RFC 8785 (JSON Canonicalization Scheme)
 * Appendix B's number serialisations and section 3.2.2/3.2.3's worked examples; RFC 8032 section 7.1's
 * Ed25519 test vectors TEST 1, 2 and 3 (key pair, signature, verification); FIPS 180-4's SHA-256 of "abc";
 * then the chain check itself: one byte flipped, an entry deleted, two entries reordered, each found at
 * exactly that entry.
 */
import {
  breakWords,
  canonicalJson,
  entryHashOf,
  headHashOf,
  keyIdOf,
  nextEntry,
  publicKeyOf,
  sha256Hex,
  signHex,
  verifyChain,
  verifyHex,
  type ChainInput,
  type LedgerEntry,
} from '@/features/ledger';
import { rfc8032Vectors as vectors } from '@/tests/support/rfc8032-vectors';

const fromIeee754Hex = (hex: string): number => Buffer.from(hex, 'hex').readDoubleBE(0);

describe('RFC 8785 canonical JSON', () => {
  // RFC 8785 Appendix B, "Number Serialization Samples": IEEE 754 bits → the one JSON text.
  test.each([
    ['0000000000000000', '0'],
    ['8000000000000000', '0'],
    ['0000000000000001', '5e-324'],
    ['8000000000000001', '-5e-324'],
    ['7fefffffffffffff', '1.7976931348623157e+308'],
    ['ffefffffffffffff', '-1.7976931348623157e+308'],
    ['4340000000000000', '9007199254740992'],
    ['c340000000000000', '-9007199254740992'],
    ['4430000000000000', '295147905179352830000'],
    ['44b52d02c7e14af5', '9.999999999999997e+22'],
    ['44b52d02c7e14af6', '1e+23'],
    ['44b52d02c7e14af7', '1.0000000000000001e+23'],
    ['444b1ae4d6e2ef4e', '999999999999999700000'],
    ['444b1ae4d6e2ef4f', '999999999999999900000'],
    ['444b1ae4d6e2ef50', '1e+21'],
    ['3eb0c6f7a0b5ed8c', '9.999999999999997e-7'],
    ['3eb0c6f7a0b5ed8d', '0.000001'],
    ['41b3de4355555553', '333333333.3333332'],
    ['41b3de4355555554', '333333333.33333325'],
    ['41b3de4355555555', '333333333.3333333'],
    ['41b3de4355555556', '333333333.3333334'],
    ['41b3de4355555557', '333333333.33333343'],
    ['becbf647612f3696', '-0.0000033333333333333333'],
    ['43143ff3c1cb0959', '1424953923781206.2'],
  ])('Appendix B: %s is %s', (bits, text) => {
    expect(canonicalJson(fromIeee754Hex(bits))).toBe(text);
  });

  test('Appendix B: NaN and Infinity (7fffffffffffffff, 7ff0000000000000) have no form and are refused', () => {
    expect(() => canonicalJson(fromIeee754Hex('7fffffffffffffff'))).toThrow();
    expect(() => canonicalJson(fromIeee754Hex('7ff0000000000000'))).toThrow();
  });

  test('section 3.2.2: the sample object, whitespace gone, members sorted, numbers and strings serialised', () => {
    const input = JSON.parse(
      '{"numbers": [333333333.33333329, 1E30, 4.50, 2e-3, 0.000000000000000000000000001],' +
        ' "string": "\\u20ac$\\u000F\\u000aA\'\\u0042\\u0022\\u005c\\\\\\"\\/",' +
        ' "literals": [null, true, false]}',
    );
    expect(canonicalJson(input)).toBe(
      '{"literals":[null,true,false],"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27],' +
        '"string":"\u20ac$\\u000f\\nA\'B\\"\\\\\\\\\\"/"}',
    );
  });

  test('section 3.2.3: members sorted by their UTF-16 code units', () => {
    const input = JSON.parse(
      '{"\\u20ac": "Euro Sign", "\\r": "Carriage Return", "\\ufb33": "Hebrew Letter Dalet With Dagesh",' +
        ' "1": "One", "\\ud83d\\ude00": "Emoji: Grinning Face", "\\u0080": "Control",' +
        ' "\\u00f6": "Latin Small Letter O With Diaeresis"}',
    );
    expect(canonicalJson(input)).toBe(
      '{"\\r":"Carriage Return","1":"One","\u0080":"Control","\u00f6":"Latin Small Letter O With Diaeresis",' +
        '"\u20ac":"Euro Sign","\ud83d\ude00":"Emoji: Grinning Face","\ufb33":"Hebrew Letter Dalet With Dagesh"}',
    );
  });

  test('the same record written in another key order has the same canonical form and hash', () => {
    expect(canonicalJson({ b: 1, a: { d: [1, 2], c: 'x' } })).toBe(
      canonicalJson({ a: { c: 'x', d: [1, 2] }, b: 1 }),
    );
  });
});

describe('SHA-256', () => {
  test('FIPS 180-4 example "abc" and the empty string (NIST CSRC examples)', () => {
    expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256Hex('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });
});

describe('Ed25519, RFC 8032 section 7.1 test vectors', () => {
  test.each(vectors)('$name: public key, signature and verification', (v) => {
    expect(publicKeyOf(v.secret)).toBe(v.public);
    expect(signHex(v.secret, v.message)).toBe(v.signature);
    expect(verifyHex(v.public, v.message, v.signature)).toBe(true);
  });

  test.each(vectors)(
    '$name: a flipped signature bit, another key or a malformed signature does not verify',
    (v) => {
      const flipped = (parseInt(v.signature[0], 16) ^ 1).toString(16) + v.signature.slice(1);
      expect(verifyHex(v.public, v.message, flipped)).toBe(false);
      const other = vectors.find((w) => w !== v)!;
      expect(verifyHex(other.public, v.message, v.signature)).toBe(false);
      expect(verifyHex(v.public, v.message, 'zz')).toBe(false);
    },
  );
});

describe('the chain check', () => {
  // Any fixed key serves as the server's; this is RFC 8032's TEST 1 secret key again.
  const privateKey = '9d61b19deffd5a60ba844af492ec2cc44449c5697b326919703bac031cae7f60';
  const serverPublic = publicKeyOf(privateKey);
  const server = { privateKey, keyId: keyIdOf(serverPublic) };
  const rideId = 'ride-1';
  const records = [
    { kind: 'inspection' as const, refId: 'i1', value: { id: 'i1', readings: [1.5, 2] } },
    { kind: 'finding' as const, refId: 'f1', value: { id: 'f1', state: 'open' } },
    { kind: 'decision' as const, refId: 'i1', value: { reviewState: 'approved' } },
    { kind: 'notice' as const, refId: 'n1', value: { reference: 'PW-2026-0001' } },
    { kind: 'finding' as const, refId: 'f1', value: { id: 'f1', state: 'closed' } },
  ];

  function build(): LedgerEntry[] {
    const out: LedgerEntry[] = [];
    records.forEach((r, i) => {
      out.push(
        nextEntry({
          rideId,
          prev: out[out.length - 1] ?? null,
          kind: r.kind,
          refId: r.refId,
          at: `2026-12-0${i + 1}T10:00:00.000Z`,
          value: r.value,
          device: null,
          server,
        }),
      );
    });
    return out;
  }

  function input(entries: LedgerEntry[], live?: Record<string, unknown>): ChainInput {
    const last = build().at(-1)!;
    return {
      entries,
      rideId,
      head: {
        seq: last.seq,
        entryHash: last.entryHash,
        signature: signHex(
          server.privateKey,
          headHashOf({ rideId, seq: last.seq, entryHash: last.entryHash }),
        ),
      },
      serverKey: (id) => (id === server.keyId ? serverPublic : null),
      deviceKey: () => null,
      live: (kind, refId) => {
        const key = `${kind}:${refId}`;
        if (!live || !(key in live)) return undefined;
        return canonicalJson(live[key]);
      },
    };
  }

  test('an untouched chain is intact, and links each entry to the one before', () => {
    const entries = build();
    expect(verifyChain(input(entries))).toEqual({ intact: true, entries: 5 });
    expect(entries[2].prevHash).toBe(entries[1].entryHash);
    expect(entries[0].prevHash).toBe('0'.repeat(64));
    expect(verifyHex(serverPublic, entries[3].entryHash, entries[3].serverSignature)).toBe(true);
  });

  test('one byte flipped in a stored record is found at exactly that entry', () => {
    for (let i = 0; i < 5; i++) {
      const entries = build();
      const r = entries[i].record;
      const at = r.indexOf(':') + 2;
      entries[i] = {
        ...entries[i],
        record: r.slice(0, at) + String.fromCharCode(r.charCodeAt(at) ^ 1) + r.slice(at + 1),
      };
      const result = verifyChain(input(entries));
      expect(result).toMatchObject({ intact: false, break: { seq: i + 1, why: 'altered' } });
    }
  });

  test('an entry whose hash was recomputed after the edit fails on its countersignature', () => {
    const entries = build();
    const edited = { ...entries[1], at: '2026-11-30T10:00:00.000Z' };
    entries[1] = { ...edited, entryHash: entryHashOf(edited) };
    // Its own link holds and its content gives its new hash: the server's signature is what shows the edit.
    expect(verifyChain(input(entries))).toMatchObject({
      intact: false,
      break: { seq: 2, why: 'countersignature' },
    });
  });

  test('a deleted entry is found at exactly its seq, in the middle and at the end', () => {
    const entries = build();
    expect(verifyChain(input([...entries.slice(0, 2), ...entries.slice(3)]))).toMatchObject({
      intact: false,
      break: { seq: 3, why: 'missing' },
    });
    expect(verifyChain(input(entries.slice(0, 4)))).toMatchObject({
      intact: false,
      break: { seq: 5, why: 'missing' },
    });
    expect(verifyChain(input(entries.slice(1)))).toMatchObject({
      intact: false,
      break: { seq: 1, why: 'missing' },
    });
  });

  test('two entries reordered (their seqs swapped) are found at the first of them', () => {
    const entries = build();
    const [a, b] = [entries[1], entries[2]];
    const swapped = [entries[0], { ...b, seq: 2 }, { ...a, seq: 3 }, entries[3], entries[4]];
    expect(verifyChain(input(swapped))).toMatchObject({
      intact: false,
      break: { seq: 2, kind: 'decision', refId: 'i1', why: 'order' },
    });
  });

  test('a live record that differs from its latest entry is found at that entry; an older state is not required', () => {
    const entries = build();
    const live = {
      'inspection:i1': { id: 'i1', readings: [1.5, 2] },
      'finding:f1': { id: 'f1', state: 'closed' },
      'notice:n1': { reference: 'PW-2026-0001' },
    };
    expect(verifyChain(input(entries, live))).toEqual({ intact: true, entries: 5 });
    const changed = { ...live, 'inspection:i1': { id: 'i1', readings: [1.5, 2.5] } };
    expect(verifyChain(input(entries, changed))).toMatchObject({
      intact: false,
      break: { seq: 1, kind: 'inspection', refId: 'i1', why: 'live_differs' },
    });
    const reopened = { ...live, 'finding:f1': { id: 'f1', state: 'open' } };
    expect(verifyChain(input(entries, reopened))).toMatchObject({
      intact: false,
      break: { seq: 5, why: 'live_differs' },
    });
  });

  test('every reason has words', () => {
    expect(Object.values(breakWords).every((w) => w.length > 10)).toBe(true);
  });
});
