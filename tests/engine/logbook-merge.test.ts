/**
 * The logbook's merge and paging (features/logbook/merge.ts), checked as properties with fast-check
 * against references outside the code under test: instants compared by `Date.parse` (ECMA-262's reading
 * of ISO 8601) rather than as text, and Unicode canonical decomposition (NFD, UAX #15) for accents.
 */
import * as fc from 'fast-check';

import { matchesText, mergeLogbook, newestFirst, pageOf } from '@/features/logbook/merge';
import { logbookKinds, type LogbookEvent } from '@/features/logbook/schema';

const instant = fc
  .integer({ min: Date.parse('2020-01-01T00:00:00Z'), max: Date.parse('2030-01-01T00:00:00Z') })
  // Whole minutes, so that ties (a decision and its notice at one instant) happen often.
  .map((ms) => new Date(ms - (ms % 60_000)).toISOString());

const event = fc.record({
  id: fc.uuid(),
  at: instant,
  kind: fc.constantFrom(...logbookKinds),
  title: fc.string({ maxLength: 20 }),
});
const toEvent = (e: { id: string; at: string; kind: LogbookEvent['kind']; title: string }): LogbookEvent => ({
  ...e,
  rideId: 'ride',
  day: e.at.slice(0, 10),
  detail: [],
  who: null,
  link: null,
  documents: [],
});
// Each entry's id is unique within the logbook, as the sources make them (`kind:row`).
const lists = fc
  .array(fc.array(event.map(toEvent), { maxLength: 30 }), { maxLength: 8 })
  .map((ls) => ls.map((l, i) => l.map((e, j) => ({ ...e, id: `${i}-${j}-${e.id}` }))));

test('the merge keeps every entry of every source once, newest first by the instant', () => {
  fc.assert(
    fc.property(lists, (ls) => {
      const merged = mergeLogbook(ls);
      expect(merged).toHaveLength(ls.flat().length);
      expect(new Set(merged)).toEqual(new Set(ls.flat()));
      for (let i = 1; i < merged.length; i++)
        expect(Date.parse(merged[i - 1].at)).toBeGreaterThanOrEqual(Date.parse(merged[i].at));
    }),
    { seed: 19, numRuns: 200 },
  );
});

test('the order is total: the same entries give the same list whatever order the sources come in', () => {
  fc.assert(
    fc.property(lists, (ls) => {
      const one = mergeLogbook(ls).map((e) => e.id);
      const other = mergeLogbook([...ls].reverse().map((l) => [...l].reverse())).map((e) => e.id);
      expect(other).toEqual(one);
      const all = ls.flat();
      for (const a of all.slice(0, 10))
        for (const b of all.slice(0, 10))
          expect(Math.sign(newestFirst(a, b)) + Math.sign(newestFirst(b, a))).toBe(0);
    }),
    { seed: 19, numRuns: 200 },
  );
});

test('pages split the list without gap or overlap, and a page past the end is empty', () => {
  fc.assert(
    fc.property(
      fc.array(fc.integer(), { maxLength: 200 }),
      fc.integer({ min: 1, max: 40 }),
      (items, size) => {
        const pages = Math.ceil(items.length / size);
        const joined = Array.from({ length: pages }, (_, i) => pageOf(items, i + 1, size).items).flat();
        expect(joined).toEqual(items);
        for (let p = 1; p <= pages; p++)
          expect(pageOf(items, p, size).items.length).toBeLessThanOrEqual(size);
        expect(pageOf(items, pages + 1, size).items).toEqual([]);
        expect(pageOf(items, 1, size).total).toBe(items.length);
      },
    ),
    { seed: 19, numRuns: 200 },
  );
});

test('text: every word must appear, case ignored, accents folded by canonical decomposition (NFD)', () => {
  const e = toEvent({ id: 'x', at: '2026-05-04T10:00:00.000Z', kind: 'finding', title: 'Finding 3 raised' });
  const withDetail = { ...e, detail: ['Crème on the café bearing'], who: 'Mira Delacourt' };
  expect(matchesText(withDetail, 'CAFE creme')).toBe(true);
  expect(matchesText(withDetail, 'delacourt raised')).toBe(true);
  expect(matchesText(withDetail, 'café missing')).toBe(false);
  expect(matchesText(withDetail, undefined)).toBe(true);
  // "é" typed precomposed (U+00E9) and decomposed (e + U+0301) are the same text under NFD.
  expect(matchesText(withDetail, 'cafe\u0301')).toBe(true);
  expect(mergeLogbook([[withDetail, e]], 'bearing')).toEqual([withDetail]);
});
