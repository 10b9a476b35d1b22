/**
 * Where a chart's labels go, as plain functions of numbers (no React, no d3: the tick candidates come in
 * as a function, d3's `scale.ticks` on a chart), so that labels never overlap at any width:
 * - `fitTicks` picks the most ticks an axis has room for, from the labels' estimated sizes;
 * - `spreadLabels` moves labels along one line (limit labels up a chart's right edge) as little as it
 *   can so that none covers another.
 */

/** Tick labels are drawn at this size (px) in the mono face. */
export const TICK_FONT_SIZE = 11;

/**
 * IBM Plex Mono gives every glyph the same advance, 600 units of a 1000-unit em (from memory of the
 * font's metrics; tests/lint/web-fonts.test.ts reads the files). The sans faces run narrower on average,
 * so the same estimate is on the safe side for them.
 */
const ADVANCE_EM = 0.6;

/** The width (px) a label takes, estimated from its characters and font size. */
export function labelWidth(text: string, fontSize = TICK_FONT_SIZE): number {
  return [...text].length * fontSize * ADVANCE_EM;
}

/** The height (px) a label takes: its font size and a little leading. */
export function labelHeight(fontSize = TICK_FONT_SIZE): number {
  return Math.ceil(fontSize * 1.2);
}

export type PlacedTick = {
  value: number;
  /** Where the tick's line is, in px along the axis. */
  at: number;
  text: string;
  /** Where the label's centre is, in px along the axis: `at`, moved inwards at an edge of `bounds`. */
  labelAt: number;
};

type FitInput = {
  /** The tick values for about `count` ticks (d3's `scale.ticks(count)`), or a fixed list. */
  candidates: (count: number) => readonly number[];
  /** Value to px along the axis. */
  position: (value: number) => number;
  format: (value: number) => string;
  /** The axis's drawn length in px. */
  length: number;
  /** 'x': labels side by side, their widths count; 'y': labels stacked, their heights count. */
  along: 'x' | 'y';
  /** Where labels may lie (px along the axis); a label at an edge moves inwards to stay inside. */
  bounds: [number, number];
  fontSize?: number;
  /** The least space (px) between two labels. */
  gap?: number;
};

/**
 * The most ticks whose labels fit the axis without touching. Tries d3's counts from what the length
 * could hold down to one; if even the fewest candidates collide (long dates on a phone, a fixed list),
 * keeps every 2nd, 3rd, … of them. Never returns labels that overlap; returns one label or none when
 * nothing else fits.
 */
export function fitTicks(input: FitInput): PlacedTick[] {
  const fontSize = input.fontSize ?? TICK_FONT_SIZE;
  const gap = input.gap ?? (input.along === 'x' ? fontSize : 4);
  const size = (t: string) => (input.along === 'x' ? labelWidth(t, fontSize) : labelHeight(fontSize));
  const place = (values: readonly number[]): PlacedTick[] => {
    const [lo, hi] = input.bounds;
    return values
      .map((value) => {
        const at = input.position(value);
        const text = input.format(value);
        const half = size(text) / 2;
        return {
          value,
          at,
          text,
          labelAt: Math.min(Math.max(at, lo + half), Math.max(lo + half, hi - half)),
        };
      })
      .filter((t) => Number.isFinite(t.at) && t.at >= lo - 0.5 && t.at <= hi + 0.5)
      .sort((a, b) => a.labelAt - b.labelAt);
  };
  const fits = (ticks: PlacedTick[]) =>
    ticks.every(
      (t, i) =>
        i === 0 || t.labelAt - size(t.text) / 2 >= ticks[i - 1].labelAt + size(ticks[i - 1].text) / 2 + gap,
    );

  // Start where even the narrowest label (one character) would be crowded, and come down.
  const most = Math.max(1, Math.floor(input.length / (size('0') + gap)));
  let fewest: readonly number[] = [];
  let previous = '';
  for (let count = Math.min(most, 20); count >= 1; count--) {
    const values = input.candidates(count);
    const key = values.join(',');
    if (key === previous) continue;
    previous = key;
    fewest = values;
    const placed = place(values);
    if (fits(placed)) return placed;
  }
  const all = place(fewest);
  // Thinning steps that keep both ends (every 2nd of 0°, 90°, … 360° keeps 360°) come first.
  const steps = Array.from({ length: Math.max(0, all.length - 1) }, (_, k) => k + 2).sort(
    (a, b) => Number((all.length - 1) % a !== 0) - Number((all.length - 1) % b !== 0) || a - b,
  );
  for (const every of steps) {
    const kept = all.filter((_, i) => i % every === 0);
    if (fits(kept)) return kept;
  }
  return all.slice(0, 1);
}

/** A label to place along one line: where it would like its centre, and its size along the line (px). */
export type WantedLabel = { want: number; size: number };

/**
 * Centres for labels along one line so that no two overlap (`gap` px between them) and all lie within
 * [lo, hi], each as near its wish as that allows: labels that would collide are stacked in their order
 * and the stack is centred on their wishes (the least squared move for a stack), stacks that then touch
 * are merged, and a stack past an end is pushed back inside. The order of the labels never changes.
 * If they cannot all fit, they overlap evenly rather than leave [lo, hi].
 */
export function spreadLabels(labels: readonly WantedLabel[], lo: number, hi: number, gap = 2): number[] {
  const order = labels.map((_, i) => i).sort((a, b) => labels[a].want - labels[b].want || a - b);
  type Stack = { items: number[]; start: number; length: number; wishSum: number };
  const stacks: Stack[] = [];
  const sizeOf = (i: number) => labels[i].size + gap;
  const room = hi - lo + gap;
  const settle = (s: Stack) => {
    // The start that puts each item nearest its wish on average, kept inside [lo, hi].
    const ideal = s.wishSum / s.items.length;
    s.start = Math.min(Math.max(ideal, lo - gap / 2), lo - gap / 2 + Math.max(0, room - s.length));
  };
  for (const i of order) {
    const offset = sizeOf(i) / 2;
    const s: Stack = { items: [i], start: 0, length: sizeOf(i), wishSum: labels[i].want - offset };
    settle(s);
    stacks.push(s);
    // Merge with the stack before while they overlap.
    while (stacks.length > 1) {
      const b = stacks[stacks.length - 1];
      const a = stacks[stacks.length - 2];
      if (a.start + a.length <= b.start + 1e-9) break;
      // Each of b's items wishes for a stack start of (its wish - its offset in the merged stack).
      const wishSum = a.wishSum + b.wishSum - b.items.length * a.length;
      const merged: Stack = {
        items: [...a.items, ...b.items],
        start: 0,
        length: a.length + b.length,
        wishSum,
      };
      settle(merged);
      stacks.splice(-2, 2, merged);
    }
  }
  const out = new Array<number>(labels.length);
  for (const s of stacks) {
    if (s.length > room && s.items.length > 1) {
      // More than the room holds: centres evenly spread, the end labels just inside, overlapping alike.
      const first = lo + labels[s.items[0]].size / 2;
      const last = hi - labels[s.items[s.items.length - 1]].size / 2;
      s.items.forEach((i, k) => (out[i] = first + ((last - first) * k) / (s.items.length - 1)));
      continue;
    }
    let at = s.start;
    for (const i of s.items) {
      out[i] = at + sizeOf(i) / 2;
      at += sizeOf(i);
    }
  }
  return out;
}
