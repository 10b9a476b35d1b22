/**
 * Where a chart's labels go (components/chart-ticks.ts) and which sample its cursor reads
 * (components/chart-nearest.ts), as plain functions. The outside reference for ticks is d3-scale's
 * nice ticks (`scale.ticks(count)`, the candidates the charts offer); for the nearest sample, the
 * definition itself: a full scan for the least distance. These run in the app project because jest maps
 * d3's ES modules to their UMD builds there (jest.config.js).
 */
import { scaleLinear, scaleUtc } from 'd3-scale';

import { nearestRank, sampleOrder } from '@/components/chart-nearest';
import { type PlacedTick, fitTicks, labelHeight, labelWidth, spreadLabels } from '@/components/chart-ticks';
import { formatAxisDate } from '@/lib/dates';

/** The short number format the charts' axes use (components/line-chart.tsx). */
const compact = (v: number) => (Math.abs(v) >= 1e4 ? `${+(v / 1e3).toFixed(0)}k` : `${+v.toPrecision(4)}`);

/** An x axis as a chart lays it out at `width` px: the plot from 60 px to 16 px short of the edge. */
function xAxis(width: number, domain: [number, number], format = compact, given?: number[]) {
  const scale = scaleLinear()
    .domain(domain)
    .range([60, width - 16]);
  const ticks = fitTicks({
    candidates: given ? () => given : (n) => scale.ticks(n),
    position: scale,
    format,
    length: width - 76,
    along: 'x',
    bounds: [24, width - 2],
  });
  return { scale, ticks };
}

const GAP = 11; // the default gap between x labels: one font size

/** No two labels' estimated boxes overlap (with the gap), and every box lies within the bounds. */
function expectApart(
  ticks: PlacedTick[],
  size: (t: PlacedTick) => number,
  gap: number,
  lo: number,
  hi: number,
) {
  for (let i = 0; i < ticks.length; i++) {
    const t = ticks[i];
    expect(t.labelAt - size(t) / 2).toBeGreaterThanOrEqual(lo - 1e-9);
    expect(t.labelAt + size(t) / 2).toBeLessThanOrEqual(hi + 1e-9);
    if (i > 0) {
      const p = ticks[i - 1];
      expect(t.labelAt - size(t) / 2 - (p.labelAt + size(p) / 2)).toBeGreaterThanOrEqual(gap - 1e-9);
    }
  }
}
const widthOf = (t: PlacedTick) => labelWidth(t.text);

describe('label sizes', () => {
  test('estimated from the characters and the font size (mono face: 0.6 em a glyph)', () => {
    expect(labelWidth('360')).toBeCloseTo(3 * 11 * 0.6);
    expect(labelWidth('3 Dec', 13)).toBeCloseTo(5 * 13 * 0.6);
    // A degree sign or an en dash is one character, not two bytes.
    expect(labelWidth('90°')).toBeCloseTo(3 * 11 * 0.6);
    expect(labelHeight(11)).toBe(14);
  });
});

describe('fitTicks on an x axis at 320 px and 1200 px', () => {
  const domains: [string, [number, number]][] = [
    ['arm angle 0–360°', [0, 360]],
    ['time 0–47.3 s', [0, 47.3]],
    ['force 0–123 456 N', [0, 123_456]],
    ['a small negative range', [-0.0042, 0.0131]],
  ];

  test.each(domains)('%s: d3’s nice ticks, as many as fit, never overlapping', (_, domain) => {
    const counts: number[] = [];
    for (const width of [320, 1200]) {
      const { scale, ticks } = xAxis(width, domain);
      expect(ticks.length).toBeGreaterThanOrEqual(2);
      expectApart(ticks, widthOf, GAP, 24, width - 2);
      // The values are exactly d3's ticks for some count (no thinning was needed here) …
      const values = ticks.map((t) => t.value);
      const k = [...Array(20).keys()].map((n) => n + 1).find((n) => scale.ticks(n).join() === values.join());
      expect(k).toBeDefined();
      // … and the next denser set d3 offers would collide.
      const denser = [...Array(20 - k!).keys()]
        .map((n) => scale.ticks(k! + n + 1))
        .find((v) => v.length > values.length);
      if (denser) {
        const crowded = fitTicks({
          candidates: () => denser,
          position: scale,
          format: compact,
          length: width - 76,
          along: 'x',
          bounds: [24, width - 2],
        });
        expect(crowded.length).toBeLessThan(denser.length);
      }
      counts.push(ticks.length);
    }
    // A desk's wide chart shows more ticks than a phone's.
    expect(counts[1]).toBeGreaterThan(counts[0]);
  });

  test('0–360° at 320 px: every 50° (8 labels of at most 3 digits in 244 px); at 1200 px every 20°', () => {
    // Worked by hand: "360" is 19.8 px, so a label needs 30.8 px with its gap; 244 px of plot fit 7.9
    // steps, d3's steps are 1, 2 or 5 × 10ⁿ, and 50° is 33.9 px apart where 20° would be 13.6 px.
    expect(xAxis(320, [0, 360]).ticks.map((t) => t.value)).toEqual([0, 50, 100, 150, 200, 250, 300, 350]);
    // 1124 px: 20° is 62 px apart (fits), 10° would be 31.2 px (fits only just: 30.8), d3 gives 10° for
    // a count of 36 and more, past the 20 the axis ever asks for.
    expect(xAxis(1200, [0, 360]).ticks.map((t) => t.value)).toEqual(scaleLinear().domain([0, 360]).ticks(20));
  });

  test('a fixed list (0°, 90°, … 360°) is thinned to every other value when it does not fit', () => {
    const given = [0, 90, 180, 270, 360];
    const wide = xAxis(320, [0, 360], (v) => `${v}°`, given);
    expect(wide.ticks.map((t) => t.value)).toEqual(given);
    // A 120 px chart: 44 px of plot, 11 px between quarters, far less than a 4-character label.
    const narrow = xAxis(120, [0, 360], (v) => `${v}°`, given);
    expect(narrow.ticks.map((t) => t.value)).toEqual([0, 360]);
    expectApart(narrow.ticks, widthOf, GAP, 24, 118);
  });

  test('dates over a year on a phone: d3’s UTC ticks, thinned to fit, and the end labels kept inside', () => {
    const from = Date.UTC(2025, 11, 1);
    const to = Date.UTC(2026, 11, 3);
    const scale = scaleLinear().domain([from, to]).range([60, 304]);
    const format = (ms: number) => formatAxisDate(ms, to - from);
    const ticks = fitTicks({
      candidates: (n) =>
        scaleUtc()
          .domain([from, to])
          .ticks(n)
          .map((d) => d.getTime()),
      position: scale,
      format,
      length: 244,
      along: 'x',
      bounds: [24, 318],
    });
    expect(ticks.length).toBeGreaterThanOrEqual(2);
    expectApart(ticks, widthOf, GAP, 24, 318);
    // Every value is one of d3's UTC ticks (months here) for some count.
    const all = new Set(
      [...Array(20).keys()].flatMap((n) =>
        scaleUtc()
          .domain([from, to])
          .ticks(n + 1)
          .map((d) => d.getTime()),
      ),
    );
    for (const t of ticks) expect(all.has(t.value)).toBe(true);
  });

  test('a label at the plot’s edge moves inwards, its grid line stays on its value', () => {
    const { scale, ticks } = xAxis(320, [0, 123_456]);
    const last = ticks[ticks.length - 1];
    expect(last.at).toBeCloseTo(scale(last.value));
    expect(last.labelAt + labelWidth(last.text) / 2).toBeLessThanOrEqual(318);
  });
});

describe('fitTicks on a y axis', () => {
  test.each([180, 220, 600])('a %i px chart: stacked labels a line apart at least, d3’s ticks', (height) => {
    const scale = scaleLinear()
      .domain([0, 1234])
      .nice()
      .range([height - 40, 14]);
    const ticks = fitTicks({
      candidates: (n) => scale.ticks(n),
      position: scale,
      format: compact,
      length: height - 54,
      along: 'y',
      bounds: [8, height - 34],
    });
    expectApart(ticks, () => labelHeight(), 4, 8, height - 34);
    // Listed from the bottom of the chart up, in ascending value.
    const values = ticks.map((t) => t.value).sort((a, b) => a - b);
    const k = [...Array(20).keys()].find((n) => scale.ticks(n + 1).join() === values.join());
    expect(k).toBeDefined();
    expect(ticks.length).toBeGreaterThanOrEqual(height >= 600 ? 8 : 3);
  });
});

describe('spreadLabels', () => {
  const apart = (centres: number[], size: number, gap: number) => {
    const s = [...centres].sort((a, b) => a - b);
    for (let i = 1; i < s.length; i++) expect(s[i] - s[i - 1]).toBeGreaterThanOrEqual(size + gap - 1e-9);
  };

  test('labels with room stay where they want to be', () => {
    expect(
      spreadLabels(
        [
          { want: 40, size: 14 },
          { want: 120, size: 14 },
        ],
        0,
        200,
      ),
    ).toEqual([40, 120]);
  });

  test('two labels 2 px apart are moved apart evenly about where they wanted to be', () => {
    const out = spreadLabels(
      [
        { want: 100, size: 14 },
        { want: 102, size: 14 },
      ],
      0,
      200,
    );
    apart(out, 14, 2);
    // The least squared move for two equal labels keeps their mean: 101.
    expect((out[0] + out[1]) / 2).toBeCloseTo(101);
    expect(out[0]).toBeLessThan(out[1]);
  });

  test('a band’s max label (above its line) and min label (under its line) drawn close never meet', () => {
    // Lines at 60 and 64 px: the max label wants 51, the min label 74; a third limit at 66 wants 57.
    const out = spreadLabels(
      [
        { want: 51, size: 14 },
        { want: 74, size: 14 },
        { want: 57, size: 14 },
      ],
      14,
      180,
    );
    apart(out, 14, 2);
    // The order along the line is kept.
    expect(out[0]).toBeLessThan(out[2]);
    expect(out[2]).toBeLessThan(out[1]);
  });

  test('labels past an end are pushed back inside; too many to fit share the room evenly', () => {
    const out = spreadLabels(
      [
        { want: 195, size: 14 },
        { want: 199, size: 14 },
      ],
      0,
      200,
    );
    apart(out, 14, 2);
    expect(Math.max(...out) + 7).toBeLessThanOrEqual(200 + 1e-9);
    const many = spreadLabels(
      Array.from({ length: 10 }, () => ({ want: 50, size: 14 })),
      0,
      100,
    );
    expect(Math.min(...many) - 7).toBeCloseTo(0);
    expect(Math.max(...many) + 7).toBeCloseTo(100);
    const steps = [...many].sort((a, b) => a - b).map((c, i, all) => (i ? c - all[i - 1] : 0));
    for (const d of steps.slice(1)) expect(d).toBeCloseTo(86 / 9);
  });
});

/** The sample among `indices` with the least |x − target|: the definition, by a full scan. */
function leastIndex(indices: number[], distance: (i: number) => number): number {
  let best = 0;
  for (let k = 1; k < indices.length; k++) if (distance(indices[k]) < distance(indices[best])) best = k;
  return best;
}

describe('nearest sample', () => {
  /** mulberry32, seeded, for repeatable data. */
  function random(seed: number) {
    let s = seed;
    return () => {
      s = (s + 0x6d2b79f5) >>> 0;
      let t = s;
      t = Math.imul(t ^ (t >>> 15), t | 1);
      t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
      return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    };
  }

  test('time in order: the order is the samples as they are, and a look-up finds the least distance a full scan finds', () => {
    const t = Float64Array.from({ length: 3600 }, (_, i) => i * 0.01);
    const y = Array.from(t, (v) => Math.sin(v));
    const order = sampleOrder(t, y);
    expect(order).toEqual([...Array(3600).keys()]);
    const rnd = random(3);
    for (let k = 0; k < 200; k++) {
      const target = -1 + rnd() * 38;
      const got = order[nearestRank(t, order, target)];
      const ref = leastIndex([...Array(3600).keys()], (i) => Math.abs(t[i] - target));
      expect(Math.abs(t[got] - target)).toBe(Math.abs(t[ref] - target));
    }
  });

  test('an arm angle over three turns with gaps: sorted once, every look-up as near as a full scan', () => {
    const rnd = random(11);
    const n = 2000;
    const x: number[] = [];
    const y: (number | null)[] = [];
    for (let i = 0; i < n; i++) {
      // Three turns of 0–360° with a gap (NaN x, null y) where each wraps, and some missing values.
      const a = ((i * 3 * 360) / n) % 360;
      if (i > 0 && a < x[x.length - 1]) {
        x.push(Number.NaN);
        y.push(null);
      }
      x.push(a);
      y.push(rnd() < 0.05 ? null : 1000 + 500 * Math.sin((a * Math.PI) / 180) + i);
    }
    const order = sampleOrder(x, y);
    // Only samples with both values, in ascending angle.
    expect(order.every((i) => Number.isFinite(x[i]) && y[i] !== null)).toBe(true);
    for (let r = 1; r < order.length; r++) expect(x[order[r]]).toBeGreaterThanOrEqual(x[order[r - 1]]);
    const usable = [...Array(x.length).keys()].filter((i) => Number.isFinite(x[i]) && y[i] !== null);
    expect(order).toHaveLength(usable.length);
    for (let k = 0; k < 300; k++) {
      const target = -20 + rnd() * 400;
      const got = order[nearestRank(x, order, target)];
      // leastIndex gives the position in `usable` of the least distance.
      const ref = usable[leastIndex(usable, (i) => Math.abs(x[i] - target))];
      expect(Math.abs(x[got] - target)).toBe(Math.abs(x[ref] - target));
    }
  });

  test('ends, ties and empty series', () => {
    const x = [0, 1, 1, 2];
    const order = sampleOrder(x, [5, 6, 7, 8]);
    expect(nearestRank(x, order, -5)).toBe(0);
    expect(nearestRank(x, order, 99)).toBe(3);
    // Exactly on a repeated x: the first sample there. Halfway between: the lower x.
    expect(order[nearestRank(x, order, 1)]).toBe(1);
    expect(order[nearestRank(x, order, 0.5)]).toBe(0);
    expect(nearestRank([], [], 1)).toBe(-1);
    expect(sampleOrder([1, 2], [null, Number.NaN])).toEqual([]);
  });
});
