/**
 * Checklist values against design and template limits.
 *
 * References (outside the code under test):
 * - A limit is inclusive: a value exactly at a maker's wear or clearance limit is still acceptable, one
 *   beyond it is not (common practice in wear-limit tables; from memory).
 * - Pin wear is judged by the share of the diameter allowance used, (nominal − d)/(nominal − min), the
 *   same convention the load engine applies to measured pins (common practice; from memory).
 * - "Near limit" from 90 % of the allowance, the project's existing margin (DEFAULT_NEAR_MARGIN), which a
 *   ride's own documents may override (`nearMargin`).
 * Every expected status below is worked out by hand from those rules, in the unit the inspector types.
 */
import { analyseInspection, analyseRecord } from '@/features/records/analysis';
import {
  checklistEnvelope,
  checklistValueStatus,
  disagreeingReadings,
  envelopeItemOf,
  isGap,
  passedOverLimitWithoutReason,
  resolveLimit,
} from '@/features/records/checklist-limits';
import {
  type ChecklistAnswer,
  type Reading,
  checklistAnswerSchema,
  inspectionRecordSchema,
} from '@/features/records/schema';
import { DEFAULT_NEAR_MARGIN } from '@/features/loads/engine';
import type { DesignData } from '@/features/loads/design-schema';
import {
  type ChecklistContent,
  type ChecklistItem,
  checklistItemSchema,
  storedChecklistContentSchema,
} from '@/features/registry/schema';
import { toSI } from '@/lib/units';

import { rodDesign } from '@/tests/support/rod-design';

// Test rod: pin nominal 60 mm, minimum 58 mm (allowance 2 mm); clearance limit 0.5 mm; speed limit 2 rad/s.
const design = rodDesign(300, 6);
const mm = (v: number) => toSI(v, 'lengthSmall', 'mm');

const item = (patch: Partial<ChecklistItem>): ChecklistItem => ({
  id: 'item',
  text: 'Item',
  guidance: null,
  photoRequired: false,
  measurementRequired: true,
  measurementKind: 'lengthSmall',
  measurementLabel: null,
  limit: null,
  ...patch,
});
const pinItem = item({ id: 'pin', limit: { source: 'design', joint: 0, quantity: 'pin_diameter' } });
const clearanceItem = item({ id: 'clear', limit: { source: 'design', joint: 0, quantity: 'clearance' } });
const gapItem = (min: number | null, max: number | null) =>
  item({
    id: 'gap',
    limit: {
      source: 'template',
      joint: null,
      min: min === null ? null : mm(min),
      max: max === null ? null : mm(max),
    },
  });

function statusOf(it: ChecklistItem, valueMm: number, d: DesignData = design) {
  const r = checklistValueStatus(it, d, mm(valueMm));
  if (!r || isGap(r)) throw new Error('expected a limit');
  return r.status;
}

describe('design limits of a pivot', () => {
  test.each([
    [60, 'within'], // new pin: none of the allowance used
    [58.21, 'within'], // 1.79/2 = 0.895 used: just under 90 %
    [58.2, 'near'], // 1.8/2 = 0.90: at the near margin
    [58.01, 'near'], // just inside the minimum
    [58, 'near'], // exactly at the minimum: still allowed
    [57.99, 'over'], // just outside
    [55.93, 'over'], // far outside (the issue's case, scaled to this pin)
  ])('pin diameter %s mm against minimum 58 mm → %s', (v, status) => {
    expect(statusOf(pinItem, v)).toBe(status);
  });

  test.each([
    [0.2, 'within'],
    [0.449, 'within'], // 0.898 of 0.5
    [0.451, 'near'], // 0.902
    [0.499, 'near'],
    [0.5, 'near'], // at the limit
    [0.501, 'over'],
  ])('clearance %s mm against 0.5 mm → %s', (v, status) => {
    expect(statusOf(clearanceItem, v)).toBe(status);
  });

  test('the ride’s own near margin replaces the default', () => {
    expect(DEFAULT_NEAR_MARGIN).toBe(0.9);
    const strict = { ...design, nearMargin: 0.5 };
    expect(statusOf(clearanceItem, 0.26, strict)).toBe('near'); // 0.52 ≥ 0.5
    expect(statusOf(clearanceItem, 0.24, strict)).toBe('within');
  });

  test('speed against the design rate limit, judged by magnitude', () => {
    const speed = item({
      measurementKind: 'rate',
      limit: { source: 'design', joint: 0, quantity: 'speed' },
    });
    const s = (radS: number) => {
      const r = checklistValueStatus(speed, design, radS);
      return r && !isGap(r) ? r.status : null;
    };
    expect(s(1.7)).toBe('within');
    expect(s(-1.9)).toBe('near');
    expect(s(2)).toBe('near');
    expect(s(2.01)).toBe('over');
  });

  test('a limit the ride does not have is a gap, said in words, never a pass', () => {
    const pivot3 = item({ limit: { source: 'design', joint: 3, quantity: 'clearance' } });
    const r = resolveLimit(pivot3, design);
    expect(r && isGap(r) ? r.gap : null).toMatch(/no clearance limit for pivot 4/);
    const amplitude = item({
      measurementKind: 'angle',
      limit: { source: 'design', joint: 0, quantity: 'amplitude' },
    });
    expect(isGap(resolveLimit(amplitude, design)!)).toBe(true);
    expect(isGap(resolveLimit(pinItem, null)!)).toBe(true);
    expect(resolveLimit(item({}), design)).toBeNull();
  });
});

describe('limits written in the template', () => {
  test.each([
    [0.3, 'within'], // min/value = 0.667
    [0.2225, 'within'], // 0.8989
    [0.222, 'near'], // 0.9009
    [0.2, 'near'], // at the minimum
    [0.199, 'over'],
  ])('minimum 0.2 mm only: %s mm → %s', (v, status) => {
    expect(statusOf(gapItem(0.2, null), v)).toBe(status);
  });

  test.each([
    [0.7, 'within'],
    [0.719, 'within'], // 0.899
    [0.721, 'near'], // 0.901
    [0.8, 'near'],
    [0.801, 'over'],
  ])('maximum 0.8 mm only: %s mm → %s', (v, status) => {
    expect(statusOf(gapItem(null, 0.8), v)).toBe(status);
  });

  // Range 0.2–0.8 mm: the allowance is measured from the middle (0.5 mm) toward the side the value is on.
  test.each([
    [0.5, 'within'],
    [0.769, 'within'], // 0.269/0.3 = 0.897
    [0.771, 'near'], // 0.903
    [0.8, 'near'],
    [0.801, 'over'],
    [0.231, 'within'], // 0.269/0.3
    [0.229, 'near'],
    [0.2, 'near'],
    [0.199, 'over'],
  ])('range 0.2–0.8 mm: %s mm → %s', (v, status) => {
    expect(statusOf(gapItem(0.2, 0.8), v)).toBe(status);
  });
});

describe('schemas', () => {
  test('an old template item (no limit) and old stored content still parse', () => {
    const old = {
      id: 'pins.main',
      text: 'Main pin',
      guidance: null,
      photoRequired: false,
      measurementRequired: true,
      measurementKind: 'lengthSmall',
      measurementLabel: 'smallest',
    };
    expect(checklistItemSchema.safeParse(old).success).toBe(true);
    const stored = storedChecklistContentSchema.parse({ areas: [{ id: 'a', title: 'A', items: [old] }] });
    expect(stored.areas[0].items[0].limit).toBeUndefined();
    expect(resolveLimit(stored.areas[0].items[0], design)).toBeNull();
  });

  test('a limit is refused where it cannot be checked, naming the field', () => {
    const issues = (v: unknown) =>
      (checklistItemSchema.safeParse(v).error?.issues ?? []).map((i) => `${i.path.join('.')}: ${i.message}`);
    const base = { text: 'x', measurementRequired: true, measurementKind: 'lengthSmall' };
    expect(issues({ ...base, limit: { source: 'template', min: null, max: null } })).toEqual([
      'limit.max: Give a minimum, a maximum or both',
    ]);
    expect(issues({ ...base, limit: { source: 'template', min: 0.002, max: 0.001 } })).toEqual([
      'limit.max: Must be above the minimum',
    ]);
    expect(issues({ ...base, measurementKind: 'count', limit: { source: 'template', max: 5 } })[0]).toMatch(
      /^limit: A limit needs a measured quantity with a unit/,
    );
    expect(
      issues({
        ...base,
        measurementKind: 'rate',
        limit: { source: 'design', joint: 0, quantity: 'clearance' },
      }),
    ).toEqual(['measurementKind: A clearance limit needs measurement kind lengthSmall']);
    expect(issues({ text: 'x', limit: { source: 'design', joint: 0, quantity: 'clearance' } })).toEqual([
      'limit: Only an item that takes a value has a limit',
    ]);
  });

  test('old answers and old records parse; new fields are kept', () => {
    const old = {
      itemId: 'a',
      area: 'A',
      text: 'T',
      result: 'pass',
      measurement: { valueSI: 0.1, unit: 'mm' },
    };
    expect(checklistAnswerSchema.parse(old)).toEqual(old);
    const now = {
      ...old,
      measurement: { valueSI: 0.1, unit: 'mm', readingId: 'r1', status: 'over' },
      overLimitReason: 'Replaced pin on site; new pin measured in readings',
    };
    expect(checklistAnswerSchema.parse(now)).toEqual(now);
    expect(
      checklistAnswerSchema.safeParse({ ...old, measurement: { ...old.measurement, status: 'bad' } }).success,
    ).toBe(false);
    const record = {
      id: '0b4d3f1e-8a3c-4f6e-9d2a-1c5b7e9f0a21',
      rideId: 'ride',
      designVersionId: null,
      templateId: null,
      templateVersion: null,
      type: 'periodic',
      startedAt: '2026-01-01T08:00:00Z',
      submittedAt: '2026-01-01T09:00:00Z',
      checklist: [old],
      readings: [],
      photos: [],
      preview: null,
    };
    expect(inspectionRecordSchema.safeParse(record).success).toBe(true);
  });
});

// ——— envelope and refusal ———

const content: ChecklistContent = {
  areas: [{ id: 'pins', title: 'Pins', items: [pinItem, clearanceItem, gapItem(0.2, 0.8)] }],
};
const answer = (itemId: string, valueSI: number, patch: Partial<ChecklistAnswer> = {}): ChecklistAnswer => ({
  itemId,
  area: 'Pins',
  text: `Answer ${itemId}`,
  result: 'pass',
  measurement: { valueSI, unit: 'mm' },
  ...patch,
});
const reading = (id: string, kind: Reading['kind'], valueSI: number): Reading => ({
  id,
  kind,
  joint: 0,
  label: kind,
  valueSI,
  unit: 'mm',
  method: 'micrometer',
  takenAt: '2026-01-01T08:30:00Z',
});

describe('checklist values in the envelope', () => {
  test('a value over its limit makes the whole check over, under its own id', () => {
    const checklist = [answer('pin', mm(57.9)), answer('gap', mm(0.5))];
    const base = analyseInspection(design, []);
    expect(base.status).not.toBe('over');
    const r = analyseRecord(design, { readings: [], checklist }, content);
    expect(r.status).toBe('over');
    const pin = r.envelope.find((e) => e.id === 'checklist:pin');
    expect(pin).toMatchObject({ status: 'over', quantity: 'lengthSmall', label: 'Checklist: Answer pin' });
    expect(pin?.ratio).toBeCloseTo(2.1 / 2, 9);
    expect(r.envelope.find((e) => e.id === 'checklist:gap')?.status).toBe('within');
  });

  test('a value that is its pivot’s reading is counted once, under the engine’s item', () => {
    const r1 = reading('r1', 'pin_diameter', mm(57.9));
    const checklist = [
      answer('pin', mm(57.9), { measurement: { valueSI: mm(57.9), unit: 'mm', readingId: 'r1' } }),
    ];
    const items = checklistEnvelope(design, content, checklist, [r1]);
    expect(items).toEqual([]);
    const r = analyseRecord(design, { readings: [r1], checklist }, content);
    expect(r.envelope.filter((e) => e.status === 'over').map((e) => e.id)).toEqual(['joints.0.pin.diameter']);
    expect(envelopeItemOf(checklist[0], r.envelope, [r1])?.id).toBe('joints.0.pin.diameter');
    // A later reading of the same pin is the one the engine uses: the checklist value then counts itself.
    const r2 = reading('r2', 'pin_diameter', mm(59.9));
    const both = analyseRecord(design, { readings: [r1, r2], checklist }, content);
    expect(both.envelope.find((e) => e.id === 'checklist:pin')?.status).toBe('over');
    expect(both.status).toBe('over');
  });

  test('not applicable and unanswered values without a limit add nothing', () => {
    const checklist = [answer('pin', mm(50), { result: 'na' }), answer('other', mm(50))];
    expect(checklistEnvelope(design, content, checklist, [])).toEqual([]);
  });
});

describe('Pass on a value over its limit needs a reason', () => {
  test('refused without, accepted with; Fail needs none', () => {
    const over = answer('clear', mm(0.6));
    expect(passedOverLimitWithoutReason(design, content, [answer('clear', mm(0.5)), over])).toMatchObject([
      { index: 1, itemId: 'clear', evaluation: { status: 'over' } },
    ]);
    expect(passedOverLimitWithoutReason(design, content, [{ ...over, overLimitReason: '  ' }])).toHaveLength(
      1,
    );
    expect(
      passedOverLimitWithoutReason(design, content, [{ ...over, overLimitReason: 'Bushing replaced today' }]),
    ).toEqual([]);
    expect(passedOverLimitWithoutReason(design, content, [{ ...over, result: 'fail' }])).toEqual([]);
  });

  test('the phone’s own “over” counts even where the server finds no limit', () => {
    const said = answer('unknown', 1, { measurement: { valueSI: 1, unit: 'mm', status: 'over' } });
    expect(passedOverLimitWithoutReason(design, content, [said])).toMatchObject([
      { index: 0, evaluation: null },
    ]);
  });
});

test('an old record holding the same clearance twice shows where they disagree', () => {
  const c = answer('clear', mm(0.42));
  const readings = [reading('a', 'clearance', mm(0.42)), reading('b', 'clearance', mm(0.55))];
  expect(disagreeingReadings(clearanceItem, c, readings).map((r) => r.id)).toEqual(['b']);
  // Linked values are one value: nothing to compare.
  const linked = { ...c, measurement: { ...c.measurement!, readingId: 'a' } };
  expect(disagreeingReadings(clearanceItem, linked, readings)).toEqual([]);
});
