/**
 * The app and the notice PDF draw the same mark for every state of every marked enumeration: the app's
 * mark components are rendered (react-native-svg's host elements read back from the tree) and the PDF's
 * marks module draws into a recording stand-in for pdfkit; both are reduced to the shapes they put down
 * (kind, geometry in the 14-unit icon box, fill, stroke and its width) and compared. Only paper differs
 * where it must: a mark drawn white on its coloured badge in the app has no badge on paper, so the PDF
 * draws it in the badge's colour with white cut-outs (the colours swap; the shapes do not).
 */
import { render } from '@testing-library/react-native';
import type { ReactTestInstance } from 'react-test-renderer';

import { EnvelopeMark, RideStatusMark } from '@/components/status-mark';
import { FindingStateMark } from '@/features/notices/finding-state-mark';
import { NoticeDeliveryMark } from '@/features/notices/notice-delivery-mark';
import { SeverityMark } from '@/features/notices/severity-mark';
import { UrgencyMark } from '@/features/review/urgency-mark';
import {
  envelopeStatuses,
  envelopeStatusVocabulary,
  findingSeverities,
  findingSeverityVocabulary,
  findingStates,
  findingStateVocabulary,
  noticeDeliveryStates,
  noticeDeliveryStateVocabulary,
  rideStatuses,
  rideStatusVocabulary,
  urgencies,
  urgencyVocabulary,
  type Mark,
} from '@/lib/vocabulary';
import { drawMarkIcon } from '@/server/pdf/marks';

type Drawn = {
  kind: 'circle' | 'rect' | 'path' | 'line';
  geometry: Record<string, number | string>;
  fill: string | null;
  stroke: string | null;
  strokeWidth: number | null;
};

// ——— the app: react-native-svg's host elements ———

/** react-native-svg hands colours to the native side as 32-bit ARGB integers. */
function argbToHex(value: unknown): string | null {
  if (!value || typeof value !== 'object' || !('payload' in value)) return null;
  const rgb = Number((value as { payload: number }).payload) & 0xffffff;
  return `#${rgb.toString(16).toUpperCase().padStart(6, '0')}`;
}

const hostKinds: Record<string, Drawn['kind']> = {
  RNSVGCircle: 'circle',
  RNSVGRect: 'rect',
  RNSVGPath: 'path',
  RNSVGLine: 'line',
};
const geometryProps: Record<Drawn['kind'], string[]> = {
  circle: ['cx', 'cy', 'r'],
  rect: ['x', 'y', 'width', 'height', 'rx'],
  path: ['d'],
  line: ['x1', 'y1', 'x2', 'y2'],
};

function appShapes(root: ReactTestInstance): Drawn[] {
  return root
    .findAll((n) => typeof n.type === 'string' && n.type in hostKinds)
    .map((n) => {
      const kind = hostKinds[n.type as string];
      const stroke = argbToHex(n.props.stroke);
      const geometry: Drawn['geometry'] = {};
      for (const key of geometryProps[kind]) {
        const v = n.props[key];
        geometry[key] = typeof v === 'string' && key !== 'd' ? Number(v) : (v ?? 0);
      }
      return {
        kind,
        geometry,
        // A line has no inside: whatever fill it inherits paints nothing.
        fill: kind === 'line' ? null : argbToHex(n.props.fill),
        stroke,
        strokeWidth: stroke ? Number(n.props.strokeWidth) : null,
      };
    });
}

/** The badge's colour and its words' colour, as the app renders them. */
function appBadge(root: ReactTestInstance): { bg: string; word: string } {
  const badge = root.find((n) => String(n.type) === 'View' && !!n.props.style?.backgroundColor);
  const text = root.find((n) => String(n.type) === 'Text');
  const styles = [text.props.style].flat(3).filter(Boolean) as { color?: string }[];
  const word = styles
    .map((s) => s.color)
    .filter(Boolean)
    .pop() as string;
  return { bg: String(badge.props.style.backgroundColor).toUpperCase(), word: word.toUpperCase() };
}

// ——— the PDF: a recording stand-in for pdfkit ———

function pdfShapes(mark: Mark, at = { x: 40, cy: 100, size: 9.5 }) {
  const shapes: Drawn[] = [];
  const transforms: string[] = [];
  let current: Pick<Drawn, 'kind' | 'geometry'> | null = null;
  let width = 1;
  let lineStart: [number, number] | null = null;
  const finish = (fill: string | null, stroke: string | null) => {
    if (!current) throw new Error('painted with no shape');
    shapes.push({ ...current, fill, stroke, strokeWidth: stroke ? width : null });
    current = null;
  };
  const up = (c: string) => c.toUpperCase();
  const doc: Record<string, (...a: never[]) => unknown> = {};
  const chain =
    <A extends unknown[]>(fn: (...a: A) => void) =>
    (...a: A) => {
      fn(...a);
      return doc;
    };
  Object.assign(doc, {
    save: chain(() => {}),
    restore: chain(() => {}),
    translate: chain((x: number, y: number) => transforms.push(`translate ${x} ${y}`)),
    scale: chain((k: number) => transforms.push(`scale ${k}`)),
    circle: chain(
      (cx: number, cy: number, r: number) => (current = { kind: 'circle', geometry: { cx, cy, r } }),
    ),
    rect: chain(
      (x: number, y: number, w: number, h: number) =>
        (current = { kind: 'rect', geometry: { x, y, width: w, height: h, rx: 0 } }),
    ),
    roundedRect: chain(
      (x: number, y: number, w: number, h: number, rx: number) =>
        (current = { kind: 'rect', geometry: { x, y, width: w, height: h, rx } }),
    ),
    path: chain((d: string) => (current = { kind: 'path', geometry: { d } })),
    moveTo: chain((x: number, y: number) => (lineStart = [x, y])),
    lineTo: chain((x: number, y: number) => {
      if (!lineStart) throw new Error('lineTo without moveTo');
      current = { kind: 'line', geometry: { x1: lineStart[0], y1: lineStart[1], x2: x, y2: y } };
    }),
    lineWidth: chain((w: number) => (width = w)),
    lineCap: chain(() => {}),
    lineJoin: chain(() => {}),
    fill: chain((c: string) => finish(up(c), null)),
    stroke: chain((c: string) => finish(null, up(c))),
    fillAndStroke: chain((f: string, s: string) => finish(up(f), up(s))),
  });
  drawMarkIcon(doc as unknown as PDFKit.PDFDocument, mark, at.x, at.cy, at.size);
  return { shapes, transforms };
}

// ——— every state of every marked enumeration ———

type Case = { name: string; state: string; mark: Mark; element: React.ReactElement };

const cases: Case[] = [
  ...rideStatuses.map((s) => ({
    name: 'ride status',
    state: s,
    mark: rideStatusVocabulary[s].mark,
    element: <RideStatusMark status={s} />,
  })),
  ...envelopeStatuses.map((s) => ({
    name: 'envelope status',
    state: s,
    mark: envelopeStatusVocabulary[s].mark,
    element: <EnvelopeMark status={s} />,
  })),
  ...urgencies.map((s) => ({
    name: 'urgency',
    state: s,
    mark: urgencyVocabulary[s].mark,
    element: <UrgencyMark urgency={s} />,
  })),
  ...findingSeverities.map((s) => ({
    name: 'finding severity',
    state: s,
    mark: findingSeverityVocabulary[s].mark,
    element: <SeverityMark severity={s} />,
  })),
  ...findingStates.map((s) => ({
    name: 'finding state',
    state: s,
    mark: findingStateVocabulary[s].mark,
    element: <FindingStateMark state={s} />,
  })),
  ...noticeDeliveryStates.map((s) => ({
    name: 'e-mail delivery',
    state: s,
    mark: noticeDeliveryStateVocabulary[s].mark,
    element: <NoticeDeliveryMark state={s} />,
  })),
];

test('every state of every marked enumeration is covered', () => {
  const total =
    rideStatuses.length +
    envelopeStatuses.length +
    urgencies.length +
    findingSeverities.length +
    findingStates.length +
    noticeDeliveryStates.length;
  expect(cases).toHaveLength(total);
});

test.each(cases.map((c) => [c.name, c.state, c] as const))(
  '%s %s: the PDF puts down the shapes and colours the app shows',
  (_name, _state, c) => {
    const { root } = render(c.element);
    const app = appShapes(root);
    expect(app.length).toBeGreaterThan(0);

    const badge = appBadge(root);
    // A mark drawn white on its badge (the words are white) prints in the badge's colour on white paper.
    const solid = badge.word === '#FFFFFF';
    const onPaper = (colour: string | null) =>
      colour === null || !solid
        ? colour
        : colour === badge.word
          ? badge.bg
          : colour === badge.bg
            ? badge.word
            : colour;
    const expected = app.map((s) => ({ ...s, fill: onPaper(s.fill), stroke: onPaper(s.stroke) }));

    const pdf = pdfShapes(c.mark);
    expect(pdf.shapes).toEqual(expected);
    // …in the same 14-unit box, scaled to the size asked for and placed with its middle on the line.
    expect(pdf.transforms).toEqual([`translate 40 ${100 - 9.5 / 2}`, `scale ${9.5 / 14}`]);
  },
);

test('the app marks themselves are told apart by shape within each enumeration, not by colour alone', () => {
  const byName = new Map<string, string[]>();
  for (const c of cases) {
    const { root } = render(c.element);
    const signature = JSON.stringify(appShapes(root).map((s) => [s.kind, s.geometry, !!s.fill, !!s.stroke]));
    byName.set(c.name, [...(byName.get(c.name) ?? []), signature]);
  }
  for (const [, signatures] of byName) expect(new Set(signatures).size).toBe(signatures.length);
});
