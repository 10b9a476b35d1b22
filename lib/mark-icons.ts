/**
 * The shapes of the vocabulary's marks, as drawing parts in a 14 × 14 box, with no React. The app draws
 * them with react-native-svg (`components/mark-icon.tsx`) and the server's PDF with pdfkit
 * (`server/pdf/marks.ts`), so a state looks the same on screen and on paper: one drawing, two painters.
 *
 * Parts are painted in the mark's `fg` (its word colour), its `bg` (the badge behind it, so a cut-out shows
 * the badge) or `white`. A part with no `fill` is drawn as an outline only.
 */

export type Paint = 'fg' | 'bg' | 'white';

type Stroke = { stroke?: Paint; strokeWidth?: number; lineCap?: 'round'; lineJoin?: 'round' };

export type IconPart =
  | ({ kind: 'circle'; cx: number; cy: number; r: number; fill?: Paint } & Stroke)
  | ({
      kind: 'rect';
      x: number;
      y: number;
      width: number;
      height: number;
      rx?: number;
      fill?: Paint;
    } & Stroke)
  | ({ kind: 'path'; d: string; fill?: Paint } & Stroke)
  | ({ kind: 'line'; x1: number; y1: number; x2: number; y2: number } & Stroke);

/** The side of the box every icon is drawn in. */
export const ICON_BOX = 14;

const triangle = 'M7 1 L13.5 13 L0.5 13 Z';
const diamond = 'M7 0.5 L13.5 7 L7 13.5 L0.5 7 Z';
const tick = 'M3.8 7.2 L6 9.4 L10.2 4.8';
const square = { kind: 'rect', x: 1, y: 1, width: 12, height: 12, rx: 2 } as const;
const bar = { kind: 'rect', x: 3, y: 6, width: 8, height: 2.2 } as const;

/**
 * Every icon a mark may use. Shapes that differ only a little (two rings, two clocks, two barred squares)
 * are kept apart because each is how its mark has always looked; a new mark should reuse one of these.
 */
export const markIcons = {
  /** A filled disc: within the envelope, in service. */
  disc: [{ kind: 'circle', cx: 7, cy: 7, r: 6, fill: 'fg' }],
  /** A triangle: near the limit, restricted, partly sent. */
  triangle: [{ kind: 'path', d: triangle, fill: 'fg' }],
  /** A square with a white bar: over the limit, out of service. */
  barred: [
    { ...square, fill: 'fg' },
    { ...bar, fill: 'white' },
  ],
  /** A square with a bar cut out to the badge: an e-mail not delivered. */
  'barred-cut': [
    { ...square, fill: 'fg' },
    { ...bar, fill: 'bg' },
  ],
  /** An open ring: a note. */
  ring: [{ kind: 'circle', cx: 7, cy: 7, r: 5.2, stroke: 'fg', strokeWidth: 2 }],
  /** A heavier ring: awaiting sign-off. */
  'ring-heavy': [{ kind: 'circle', cx: 7, cy: 7, r: 5.4, stroke: 'fg', strokeWidth: 2.2 }],
  /** A filled diamond: fix by date. */
  diamond: [{ kind: 'path', d: diamond, fill: 'fg' }],
  /** A diamond with a white exclamation: findings past due. */
  'diamond-exclaim': [
    { kind: 'path', d: diamond, fill: 'fg' },
    { kind: 'rect', x: 6.1, y: 3.6, width: 1.8, height: 4.4, fill: 'white' },
    { kind: 'rect', x: 6.1, y: 9, width: 1.8, height: 1.6, fill: 'white' },
  ],
  /** An outlined square with an exclamation: fix before operation. */
  'square-exclaim': [
    { kind: 'rect', x: 1, y: 1, width: 12, height: 12, rx: 1.5, stroke: 'fg', strokeWidth: 2 },
    { kind: 'rect', x: 6, y: 3.2, width: 2, height: 4.8, fill: 'fg' },
    { kind: 'rect', x: 6, y: 9.2, width: 2, height: 2, fill: 'fg' },
  ],
  /** An octagon with a bar cut out to the badge: stop now. */
  octagon: [
    { kind: 'path', d: 'M4.1 0.5 H9.9 L13.5 4.1 V9.9 L9.9 13.5 H4.1 L0.5 9.9 V4.1 Z', fill: 'fg' },
    { ...bar, fill: 'bg' },
  ],
  /** A disc with a white cross: failed checklist items. */
  crossed: [
    { kind: 'circle', cx: 7, cy: 7, r: 6.5, fill: 'fg' },
    { kind: 'line', x1: 4.4, y1: 4.4, x2: 9.6, y2: 9.6, stroke: 'white', strokeWidth: 2, lineCap: 'round' },
    { kind: 'line', x1: 9.6, y1: 4.4, x2: 4.4, y2: 9.6, stroke: 'white', strokeWidth: 2, lineCap: 'round' },
  ],
  /** A clock face: an inspection overdue. */
  'clock-overdue': [
    { kind: 'circle', cx: 7, cy: 7, r: 5.6, stroke: 'fg', strokeWidth: 1.8 },
    { kind: 'path', d: 'M7 3.8 L7 7.2 L9.6 8.6', stroke: 'fg', strokeWidth: 1.6, lineCap: 'round' },
  ],
  /** A clock face: an e-mail being sent. */
  clock: [
    { kind: 'circle', cx: 7, cy: 7, r: 5.8, stroke: 'fg', strokeWidth: 1.8 },
    { kind: 'path', d: 'M7 3.6 V7 L9.4 8.6', stroke: 'fg', strokeWidth: 1.6, lineCap: 'round' },
  ],
  /** A ring with a dot: a finding open. */
  'ring-dot': [
    { kind: 'circle', cx: 7, cy: 7, r: 5.8, stroke: 'fg', strokeWidth: 1.8 },
    { kind: 'circle', cx: 7, cy: 7, r: 1.8, fill: 'fg' },
  ],
  /** A half-filled ring: a corrective action reported. */
  half: [
    { kind: 'circle', cx: 7, cy: 7, r: 5.8, stroke: 'fg', strokeWidth: 1.8 },
    { kind: 'path', d: 'M7 1.2 A5.8 5.8 0 0 1 7 12.8 Z', fill: 'fg' },
  ],
  /** A disc with a tick cut out to the badge: closed, sent. */
  tick: [
    { kind: 'circle', cx: 7, cy: 7, r: 6.5, fill: 'fg' },
    { kind: 'path', d: tick, stroke: 'bg', strokeWidth: 1.9, lineCap: 'round', lineJoin: 'round' },
  ],
  /** An outlined square with a dash: no address. */
  'square-dash': [
    { kind: 'rect', x: 1.5, y: 1.5, width: 11, height: 11, rx: 2, stroke: 'fg', strokeWidth: 1.8 },
    { kind: 'rect', x: 4, y: 6.1, width: 6, height: 1.8, fill: 'fg' },
  ],
} as const satisfies Record<string, readonly IconPart[]>;

export type MarkIconName = keyof typeof markIcons;

/** The parts of an icon, typed as parts (the table above keeps its literal types for the names). */
export const iconParts = (name: MarkIconName): readonly IconPart[] => markIcons[name];
