/**
 * Where every part, pivot, centre of gravity and seat of a ride's body chain lies at a given pose, in the
 * global frame of features/loads/README.md (x right, y up, metres; angles counter-clockwise from +x). Pure
 * TypeScript so the drawing's geometry is tested without a screen; the drawing only maps these points to
 * pixels with `fitToView`.
 */
import type { CycleResult } from '@/features/loads/engine';
import { type DesignData, designBodies } from '@/features/loads/design-schema';

export type Point = readonly [number, number];

export type ChainShape =
  | { kind: 'segment'; body: number; name: string; from: Point; to: Point }
  /** Discs, spheres (solid) and rings (outline only). */
  | { kind: 'circle'; body: number; name: string; centre: Point; radius: number; solid: boolean }
  /** Plates and sized counterweights: four corners in order round the rectangle. */
  | {
      kind: 'rect';
      body: number;
      name: string;
      corners: [Point, Point, Point, Point];
      counterweight: boolean;
    }
  /** Point masses, custom parts (at their CG) and counterweights without a size. */
  | { kind: 'mass'; body: number; name: string; at: Point };

export type BodyPlacement = {
  index: number;
  name: string;
  /** The body's inboard pivot (joint `index`). */
  origin: Point;
  /** Absolute angle of the body's x-axis. */
  angleRad: number;
  /** The next body's pivot; null on the last body. */
  tip: Point | null;
  cg: Point;
  massKg: number;
};

export type PivotPlacement = { joint: number; name: string; at: Point };

export type SeatPlacement = {
  name: string;
  body: number;
  at: Point;
  /** Unit vector of the rider's spine (seat to head), global. */
  spine: Point;
};

export type Bounds = { minX: number; maxX: number; minY: number; maxY: number };

export type ChainLayout = {
  bodies: BodyPlacement[];
  pivots: PivotPlacement[];
  shapes: ChainShape[];
  seats: SeatPlacement[];
  bounds: Bounds;
};

/**
 * The pose the design drawing shows: each joint at the centre of its design swing, at 0 when it turns
 * steadily (the body's frame as the design document draws it), at its set angle when it is held.
 */
export function designPose(d: DesignData): number[] {
  return d.bodies.map((_, i) => {
    const m = d.motion.find((row) => row.joint === i);
    return m?.kind === 'fixed' ? (m.angleRad ?? 0) : 0;
  });
}

/** The joint angles at the instant a joint's force peaks over the analysed cycle. */
export function peakPose(result: CycleResult, joint = 0): number[] {
  const k = result.joints[joint].peakForce.index;
  return result.joints.map((j) => j.angleRad[k]);
}

const rotate = (p: Point, c: number, s: number): Point => [c * p[0] - s * p[1], s * p[0] + c * p[1]];

/** Places the chain at `pose` (joint angles relative to the parent body, radians). */
export function chainLayout(d: DesignData, pose: readonly number[]): ChainLayout {
  const chain = designBodies(d);
  const bodies: BodyPlacement[] = [];
  let origin: Point = [0, 0];
  let angle = 0;
  for (let i = 0; i < d.bodies.length; i++) {
    angle += pose[i] ?? 0;
    const c = Math.cos(angle);
    const s = Math.sin(angle);
    const place = (p: Point): Point => {
      const r = rotate(p, c, s);
      return [origin[0] + r[0], origin[1] + r[1]];
    };
    const tipM = i < d.bodies.length - 1 ? d.bodies[i].tipM : undefined;
    bodies.push({
      index: i,
      name: d.bodies[i].name,
      origin,
      angleRad: angle,
      tip: tipM ? place(tipM) : null,
      cg: place(chain[i].cgM),
      massKg: chain[i].massKg,
    });
    origin = tipM ? place(tipM) : origin;
  }

  const toGlobal = (body: number, p: Point): Point => {
    const b = bodies[body];
    const r = rotate(p, Math.cos(b.angleRad), Math.sin(b.angleRad));
    return [b.origin[0] + r[0], b.origin[1] + r[1]];
  };

  const shapes: ChainShape[] = d.parts
    .filter((p) => p.body < bodies.length)
    .map((p): ChainShape => {
      const base = { body: p.body, name: p.name };
      switch (p.kind) {
        case 'rod':
          return { ...base, kind: 'segment', from: toGlobal(p.body, p.fromM), to: toGlobal(p.body, p.toM) };
        case 'point':
          return { ...base, kind: 'mass', at: toGlobal(p.body, p.atM) };
        case 'custom':
          return { ...base, kind: 'mass', at: toGlobal(p.body, p.cgM) };
        case 'disc':
        case 'sphere':
        case 'ring':
          return {
            ...base,
            kind: 'circle',
            centre: toGlobal(p.body, p.centreM),
            radius: p.radiusM,
            solid: p.kind !== 'ring',
          };
        case 'plate':
        case 'counterweight': {
          if (p.widthM === undefined || p.heightM === undefined)
            return { ...base, kind: 'mass', at: toGlobal(p.body, p.centreM) };
          const [cx, cy] = p.centreM;
          const w = p.widthM / 2;
          const h = p.heightM / 2;
          return {
            ...base,
            kind: 'rect',
            counterweight: p.kind === 'counterweight',
            corners: [
              toGlobal(p.body, [cx - w, cy - h]),
              toGlobal(p.body, [cx + w, cy - h]),
              toGlobal(p.body, [cx + w, cy + h]),
              toGlobal(p.body, [cx - w, cy + h]),
            ],
          };
        }
      }
    });

  const pivots: PivotPlacement[] = bodies.map((b) => ({
    joint: b.index,
    name: d.pivots.find((p) => p.joint === b.index)?.name ?? `Joint ${b.index + 1}`,
    at: b.origin,
  }));

  const seats: SeatPlacement[] = d.seats
    .filter((s) => s.body < bodies.length)
    .map((s) => {
      const a = bodies[s.body].angleRad + s.spineAngleRad;
      return {
        name: s.name,
        body: s.body,
        at: toGlobal(s.body, s.positionM),
        spine: [Math.cos(a), Math.sin(a)],
      };
    });

  return { bodies, pivots, shapes, seats, bounds: boundsOf({ bodies, pivots, shapes, seats }) };
}

function boundsOf(layout: Omit<ChainLayout, 'bounds'>): Bounds {
  const b: Bounds = { minX: Infinity, maxX: -Infinity, minY: Infinity, maxY: -Infinity };
  const add = (p: Point, r = 0) => {
    b.minX = Math.min(b.minX, p[0] - r);
    b.maxX = Math.max(b.maxX, p[0] + r);
    b.minY = Math.min(b.minY, p[1] - r);
    b.maxY = Math.max(b.maxY, p[1] + r);
  };
  layout.pivots.forEach((p) => add(p.at));
  layout.bodies.forEach((body) => add(body.cg));
  layout.seats.forEach((s) => add(s.at));
  for (const s of layout.shapes) {
    if (s.kind === 'segment') {
      add(s.from);
      add(s.to);
    } else if (s.kind === 'circle') add(s.centre, s.radius);
    else if (s.kind === 'rect') s.corners.forEach((c) => add(c));
    else add(s.at);
  }
  return b;
}

type ViewFit = {
  /** Pixels per metre, the same on both axes so the drawing stays to scale. */
  scale: number;
  toScreen: (p: Point) => [number, number];
};

/**
 * Fits `bounds` into a `width` × `height` pixel box with `padding` pixels all round, centred, with y
 * turned to point down as the screen's does. A chain that is a single point still gets a finite scale.
 */
export function fitToView(bounds: Bounds, width: number, height: number, padding: number): ViewFit {
  const spanX = Math.max(bounds.maxX - bounds.minX, 1e-6);
  const spanY = Math.max(bounds.maxY - bounds.minY, 1e-6);
  const scale = Math.max(1e-6, Math.min((width - 2 * padding) / spanX, (height - 2 * padding) / spanY));
  const midX = (bounds.minX + bounds.maxX) / 2;
  const midY = (bounds.minY + bounds.maxY) / 2;
  return {
    scale,
    toScreen: (p) => [width / 2 + (p[0] - midX) * scale, height / 2 - (p[1] - midY) * scale],
  };
}

/** A round length (1, 2 or 5 × 10ⁿ) close to `target`, for the scale bar. */
export function niceLength(target: number): number {
  if (!(target > 0) || !Number.isFinite(target)) return 1;
  const power = 10 ** Math.floor(Math.log10(target));
  const f = target / power;
  return (f < 1.5 ? 1 : f < 3.5 ? 2 : f < 7.5 ? 5 : 10) * power;
}

/**
 * The SVG path of the CG symbol: a circle cut into quarters, the top-right and bottom-left quarters
 * filled (drawing convention for a centre of gravity). Returns the filled quarters only; draw the
 * outline as a circle.
 */
export function cgQuartersPath(cx: number, cy: number, r: number): string {
  // Screen y points down: "top-right" runs from 12 o'clock to 3 o'clock.
  return [
    `M ${cx} ${cy} L ${cx} ${cy - r} A ${r} ${r} 0 0 1 ${cx + r} ${cy} Z`,
    `M ${cx} ${cy} L ${cx} ${cy + r} A ${r} ${r} 0 0 1 ${cx - r} ${cy} Z`,
  ].join(' ');
}

export type Box = { x: number; y: number; w: number; h: number };

const overlaps = (a: Box, b: Box) => a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;

/**
 * Places one label box beside each anchor (pivot) so that no two labels overlap, no label covers another
 * anchor, and all stay inside the view. Tries the four corners round the anchor first, then the same
 * corners stepped further out; falls back to the first corner when nothing fits.
 */
export function placeLabels(
  anchors: readonly (readonly [number, number])[],
  sizes: readonly { w: number; h: number }[],
  width: number,
  height: number,
  gap = 14,
): Box[] {
  const placed: Box[] = [];
  const anchorBoxes = anchors.map(([x, y]) => ({ x: x - 10, y: y - 10, w: 20, h: 20 }));
  anchors.forEach(([ax, ay], i) => {
    const { w, h } = sizes[i];
    const candidates: Box[] = [];
    for (let step = 0; step < 4; step++) {
      const out = gap + step * (h + 6);
      candidates.push(
        { x: ax + gap, y: ay - out - h + gap / 2, w, h },
        { x: ax + gap, y: ay + out - gap / 2, w, h },
        { x: ax - gap - w, y: ay - out - h + gap / 2, w, h },
        { x: ax - gap - w, y: ay + out - gap / 2, w, h },
      );
    }
    const inside = (b: Box) => b.x >= 2 && b.y >= 2 && b.x + b.w <= width - 2 && b.y + b.h <= height - 2;
    const free = (b: Box) =>
      inside(b) && !placed.some((p) => overlaps(p, b)) && !anchorBoxes.some((a) => overlaps(a, b));
    const chosen = candidates.find(free) ?? {
      ...candidates[0],
      x: Math.min(Math.max(2, candidates[0].x), width - w - 2),
      y: Math.min(Math.max(2, candidates[0].y), height - h - 2),
    };
    placed.push(chosen);
  });
  return placed;
}

/**
 * A drawing height that suits the chain's shape: a long horizontal arm gets a low drawing, a hanging
 * pendulum a tall one, within [min, max] pixels.
 */
export function drawingHeight(
  bounds: Bounds,
  width: number,
  padding: number,
  min: number,
  max: number,
): number {
  const spanX = Math.max(bounds.maxX - bounds.minX, 1e-6);
  const spanY = Math.max(bounds.maxY - bounds.minY, 1e-6);
  const wanted = ((width - 2 * padding) * spanY) / spanX + 2 * padding;
  return Math.round(Math.min(max, Math.max(min, wanted)));
}
