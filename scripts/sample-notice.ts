/**
 * An invented notice for the PDF tests and the preview script: an invented inspection body, park, ride,
 * maker and people. Three findings of different severities with due dates (the first with two photos),
 * a results table with within / near / over rows, and small photos made here (PNG drawn in code, one
 * JPEG stored below) so nothing is read from disk or the network.
 */
import { createHash } from 'node:crypto';
import { deflateSync } from 'node:zlib';

import { CAUTION_FULL } from '@/lib/caution-text';
import type { NoticeDocument } from '@/features/notices/schema';

// ——— photos ———

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

function crc32(buf: Buffer): number {
  let c = 0xffffffff;
  for (const b of buf) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}

/** A truecolour PNG (8 bits per channel, no filtering), per the PNG specification (W3C, 2nd ed.). */
export function encodePng(
  width: number,
  height: number,
  pixel: (x: number, y: number) => [number, number, number],
): Buffer {
  const raw = Buffer.alloc((width * 3 + 1) * height);
  for (let y = 0; y < height; y++) {
    const row = y * (width * 3 + 1);
    raw[row] = 0;
    for (let x = 0; x < width; x++) {
      const [r, g, b] = pixel(x, y);
      raw[row + 1 + x * 3] = r;
      raw[row + 2 + x * 3] = g;
      raw[row + 3 + x * 3] = b;
    }
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // colour type: truecolour
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw)),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** A grey lug plate with a weld bead and a dark crack line across its toe (landscape). */
const weldToePng = encodePng(200, 150, (x, y) => {
  const bead = Math.abs(y - 70 - Math.sin(x / 9) * 3) < 12;
  const crack = Math.abs(y - 82 - (x - 60) * 0.08) < 1.4 && x > 60 && x < 150;
  if (crack) return [40, 20, 20];
  if (bead) return [170 - ((x * 7) % 20), 168, 160];
  return [118 + ((x + y) % 9), 124, 128];
});

/** A dial gauge face against a dark ground (portrait, to check that thumbnails fit inside their box). */
const dialPng = encodePng(120, 180, (x, y) => {
  const d = Math.hypot(x - 60, y - 90);
  const needle = Math.abs((x - 60) * 0.55 + (y - 90)) < 2 && x >= 60 && d < 40;
  if (needle) return [176, 35, 26];
  if (d < 44) return [245, 245, 240];
  if (d < 48) return [60, 64, 70];
  return [28, 42, 56];
});

const PIN_BOSS_JPEG_BASE64 = [
  '/9j/4AAQSkZJRgABAQAAAQABAAD/2wCEAAoHBwgHBgoICAgLCgoLDhgQDg0NDh0VFhEYIx8lJCIfIiEmKzcvJik0KSEiMEEx',
  'NDk7Pj4+JS5ESUM8SDc9PjsBCgsLDg0OHBAQHDsoIig7Ozs7Ozs7Ozs7Ozs7Ozs7Ozs7Ozs7Ozs7Ozs7Ozs7Ozs7Ozs7Ozs7',
  'Ozs7Ozs7Ozs7O//AABEIAFoAeAMBEQACEQEDEQH/xAGiAAABBQEBAQEBAQAAAAAAAAAAAQIDBAUGBwgJCgsQAAIBAwMCBAMF',
  'BQQEAAABfQECAwAEEQUSITFBBhNRYQcicRQygZGhCCNCscEVUtHwJDNicoIJChYXGBkaJSYnKCkqNDU2Nzg5OkNERUZHSElK',
  'U1RVVldYWVpjZGVmZ2hpanN0dXZ3eHl6g4SFhoeIiYqSk5SVlpeYmZqio6Slpqeoqaqys7S1tre4ubrCw8TFxsfIycrS09TV',
  '1tfY2drh4uPk5ebn6Onq8fLz9PX29/j5+gEAAwEBAQEBAQEBAQAAAAAAAAECAwQFBgcICQoLEQACAQIEBAMEBwUEBAABAncA',
  'AQIDEQQFITEGEkFRB2FxEyIygQgUQpGhscEJIzNS8BVictEKFiQ04SXxFxgZGiYnKCkqNTY3ODk6Q0RFRkdISUpTVFVWV1hZ',
  'WmNkZWZnaGlqc3R1dnd4eXqCg4SFhoeIiYqSk5SVlpeYmZqio6Slpqeoqaqys7S1tre4ubrCw8TFxsfIycrS09TV1tfY2dri',
  '4+Tl5ufo6ery8/T19vf4+fr/2gAMAwEAAhEDEQA/AN/FdVzmDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFw',
  'DFFwDFFwH4qLjDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwDFFwH4qLjDFFwDFFwDFFwDFFwEYqilm',
  'IVQMkk4AFFwMK68SqpZbWHf6O/A6+n/6qLlWK3/CS3v/ADyg/wC+T/jRcLImt/Exzi5twRn70Z6D6H/Gi4WN6GWOeJZYmDow',
  'yCKLiH4ouIMUXAMUXAMUXAMUXAfiouUGKLgGKLgGKLgGKLgclrmp/bbjyY/9TESAQc7z6+mPT/69UNIyHkSJdztgUDK/9oRf',
  '3X/If40BYnimSZcoc46j0oA0dK1FtOut5BaNxh1B7eo9x/jQJnZqVdQykMrDIIOQRU3ELii4Bii4Bii4Bii4D8VNxhii4Bii',
  '4Bii4EF67Q2NxKhw6RMynHQgUJgcDWgzLupGknYHopwBQM008OStAGedUkIzs25APpnNee8dFSslod6wUnG7eplqZLW4IIwy',
  'NtYZ/MV3pqSujhkmnZmrTJO20N2l0e3ZzkhSvTsCQP0FQ9xF/FK4Bii4Bii4Bii4DsVFxhii4Bii4Bii4Fe/Rn065VFLM0Tg',
  'ADJJwaaeoHAVsBlXKFLhwe5yPxoGbaeI4fIBkhfzcchcbSfrmvKeBlzaPQ9NY2PLqtTCkdp53kIAaRixx05r04xUYqK6HnSl',
  'zNt9TWR1ddyniqIO30FGXRbcMpBwxwR2LEispPUDRxU3AMUXAMUXAMUXAfiouMMUXAMUXAMUXAMUXA4fWtLbTLvjHkykmPB6',
  'D0/DIrojK6EZU0KTLtcdOhHUVQFX+zv+mv8A47/9egdwe1MIyuWHc+lACRyNG2R07j1oEekaPqFlqNmDZEqsQCGN/vIB0zz6',
  'DrXPJNPUZoYqbgGKLgGKLgGKLgOxUXGGKLgGKLgGKLgGKLgR3FrDdRGKeJZEPZh09x6H3pqTWwHL3nhO6jLNaSLMnZWO1uvT',
  '0PHfit1VXUVin/wjmrf8+n/kRP8AGq9pHuKxYtfCl9Mc3DJbrnBydzdOuBx+tS6qWw7EPiHwr9ii+2WAZ4UX96h5K4/i+nr6',
  'fToQqX0YGBYX9xpt2tzbPtdeCD0YehHpWjSaswPRNI1uz1iP9y22dV3SQt1X/Ee49RnFc0ouIzRxUXAMUXAMUXAfipuMMUXA',
  'MUXAMUXAMUXAMUXAMUXAMUXAMUXAMUXA5XxP4X+0b9Q0+P8AfdZYVH+s9x7+3f69dqdS2jE0cbb3E1pcJcW8hjljOVYdq6Wk',
  '1ZiPRNC8Q22rwKjskV2OGiJxu46r6jj8P1PJODj6DRsYrO4wxRcB+Ki4wxRcAxRcAxRcAxRcAxRcAxRcAxRcAxRcAxRcAxRc',
  'DnfEfhaLUYmubKNIrtckgAAS9zn/AGvf8/UbU6vLo9hNHA/vbaf+OKWJvdWRgf0INdmjRJ3/AIa8SpqqC1umCXij6CUeo9/U',
  'fiPbjqU+XVbFJnQ4rG4x+Ki4wxRcAxRcAxRcAxRcAxRcAxRcAxRcAxRcAxRcAxRcAxRcDE17wxa6wjzRqIr3A2y9mx2Yf169',
  'PTFbU6rhp0E1c85ubaazuHt7iMxyxnDKe1dyaauiDtPC3in7Ts07UZP333YpmP8ArP8AZP8Ateh7/Xry1aVveiUmddXGWFAB',
  'QAUAFABQAUAFABQAUAFABQAUAcV8QkQSWEgUB2EgLY5IG3Az+J/OuzDPciRxtdZJ/9k=',
].join('');

/** A pin boss with its arm, as a baseline JPEG made once with a general-purpose image encoder. */
const pinBossJpeg = Buffer.from(PIN_BOSS_JPEG_BASE64, 'base64');

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');

export const fixturePhotos = {
  weldToe: { sha256: sha(weldToePng), bytes: weldToePng },
  pinBoss: { sha256: sha(pinBossJpeg), bytes: pinBossJpeg },
  dial: { sha256: sha(dialPng), bytes: dialPng },
};

const photoBySha = new Map(Object.values(fixturePhotos).map((p) => [p.sha256, p.bytes]));

/** The `loadPhoto` the renderer takes: every fixture photo by its SHA-256, null for anything else. */
export const loadFixturePhoto = (sha256: string): Buffer | null => photoBySha.get(sha256) ?? null;

// ——— the notice ———

export const fixtureNotice: NoticeDocument = {
  reference: 'PW-2026-0042',
  kind: 'inspection',
  issuedAt: '2026-03-12T16:05:00.000Z',
  issuer: {
    name: 'Halvard Ride Inspection Services',
    address: 'Unit 4, Coldharbour Yard, Wexley Road, Tamsworth TW3 8QP',
    phone: '+44 1632 960 418',
  },
  operator: {
    id: 'op_marrowby',
    name: 'Marrowby Leisure Company Ltd',
    address: 'The Esplanade Office, Marrowby Bay MB1 2LS',
  },
  ride: {
    id: 'ride_tidecaller',
    name: 'Tidecaller',
    rideClass: 'Pendulum swing',
    maker: 'Fenlow Ride Works',
    model: 'Arcwing 30',
    serial: 'FRW-AW30-0412',
    year: 2014,
  },
  site: { name: 'Marrowby Bay Pleasure Gardens', address: 'North Promenade, Marrowby Bay MB1 4AE' },
  inspection: {
    id: 'insp_0311',
    type: 'periodic',
    typeLabel: 'Periodic inspection',
    date: '2026-03-11',
    inspectorName: 'Priya Ostrander',
    inspectorCredential: 'Registered inspector HRIS-2231; NDT level II (MT)',
    designVersion: 3,
    engineVersion: '1.4.0',
  },
  results: [
    {
      label: 'Main pivot shaft — peak resultant force',
      value: '412 kN',
      limit: '≤ 480 kN',
      ratio: 0.858,
      status: 'within',
    },
    {
      label: 'Main pivot pin — outside diameter (worst station)',
      value: '119.82 mm',
      limit: '≥ 119.70 mm (new 120.00 mm)',
      ratio: 0.6,
      status: 'within',
    },
    {
      label: 'Swing amplitude at full programme',
      value: '112°',
      limit: '≤ 115°',
      ratio: 0.974,
      status: 'near',
    },
    {
      label: 'Rider acceleration +Gz, seat 7 (on the swing plane)',
      value: '3.62 g',
      limit: '≤ 4.00 g (sustained)',
      ratio: 0.905,
      status: 'near',
    },
    {
      label: 'Gondola slewing bearing spindle — peak force',
      value: '171 kN',
      limit: '≤ 180 kN',
      ratio: 0.95,
      status: 'near',
    },
    {
      label: 'Gondola slewing bearing spindle — diametral clearance',
      value: '0.62 mm',
      limit: '≤ 0.50 mm',
      ratio: 1.24,
      status: 'over',
    },
  ],
  loadSummary: [
    { pivot: 'Main pivot shaft', peakForce: '412 kN', limit: '≤ 480 kN' },
    { pivot: 'Gondola slewing bearing spindle', peakForce: '171 kN', limit: '≤ 180 kN' },
    { pivot: 'Counterweight arm pin', peakForce: '96.4 kN', limit: null },
  ],
  checklist: { total: 46, failed: 3 },
  findings: [
    {
      id: 'fnd_1',
      number: 1,
      severity: 'stop_now',
      description:
        'Crack indication about 18 mm long at the weld toe of the main pivot lug, drive side, confirmed by magnetic particle testing.',
      ruleRef: 'Maker’s manual FRW-AW30, section 7.4: no crack indications are permitted in pivot lugs.',
      requiredAction:
        'Keep the ride locked out and tagged out. Have the lug assessed by a qualified engineer, repair it to the maker’s approved procedure, then test every pivot lug by MT before return to service.',
      dueOn: '2026-03-20',
      state: 'open',
      photos: [
        {
          sha256: fixturePhotos.weldToe.sha256,
          caption: 'Weld toe of the drive-side lug after MT, crack marked',
        },
        { sha256: fixturePhotos.pinBoss.sha256, caption: 'Main pivot boss and arm, general view' },
      ],
    },
    {
      id: 'fnd_2',
      number: 2,
      severity: 'fix_before_operation',
      description:
        'Gondola slewing bearing spindle: diametral clearance measured at 0.62 mm with the load reversed, over the maker’s limit of 0.50 mm.',
      ruleRef: 'Maker’s wear limits, design data version 3, pivot 2.',
      requiredAction:
        'Replace the spindle bushing and re-measure the clearance. Send the readings as evidence.',
      dueOn: '2026-03-27',
      state: 'open',
      photos: [
        { sha256: fixturePhotos.dial.sha256, caption: 'Dial indicator at the spindle, load reversed' },
      ],
    },
    {
      id: 'fnd_3',
      number: 3,
      severity: 'fix_by_date',
      description:
        'Two anchor bolts on the east outrigger have no witness marks, so their torque cannot be verified at a glance.',
      ruleRef: 'Maker’s manual FRW-AW30, section 5.2 (foundation bolts).',
      requiredAction: 'Torque the east outrigger anchor bolts to the maker’s value and apply witness marks.',
      dueOn: '2026-04-17',
      state: 'open',
      photos: [],
    },
  ],
  operatingStatus: {
    status: 'out_of_service',
    reason:
      'Finding 1 (stop now): crack indication at the main pivot lug. Locked out and tagged out on 11 March 2026.',
  },
  reinspection: {
    required: true,
    reason: 'After the lug repair and the spindle bushing replacement, before the ride returns to service.',
  },
  note: 'The clearance on the gondola spindle has grown at each of the last three inspections; please send the bushing’s batch record with the evidence.',
  appeal:
    'If you disagree with this notice, write to Halvard Ride Inspection Services within 14 days of the issue date, quoting the reference, with your reasons and any evidence. The ride’s status stands while an appeal is considered.',
  caution: CAUTION_FULL,
  signature: {
    name: 'Tomas Brennock',
    role: 'Lead inspector (supervisor)',
    signedAt: '2026-03-12T16:05:00.000Z',
  },
  url: 'https://pivotwatch.example/notices/PW-2026-0042',
};

/** The fixture with `n` findings (the three above, repeated with new numbers and due dates). */
export function noticeWithFindings(n: number): NoticeDocument {
  const findings = Array.from({ length: n }, (_, i) => {
    const base = fixtureNotice.findings[i % fixtureNotice.findings.length];
    const day = String((i % 28) + 1).padStart(2, '0');
    return {
      ...base,
      id: `fnd_${i + 1}`,
      number: i + 1,
      description: `Finding ${i + 1} of ${n}. ${base.description}`,
      dueOn: `2026-05-${day}`,
    };
  });
  return {
    ...fixtureNotice,
    reference: 'PW-2026-0043',
    url: 'https://pivotwatch.example/notices/PW-2026-0043',
    findings,
  };
}
