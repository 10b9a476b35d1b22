import type { ChainBody, Vec2 } from '@/features/loads/engine/chain';

/**
 * Parts a body is built from, each placed in the body's own frame (origin at its inboard pivot).
 * Inertias are about the part's own centre, axis normal to the plane of motion (standard results:
 * slender rod mL²/12, disc mR²/2, thin ring mR², solid sphere 2mR²/5, rectangular plate m(a²+b²)/12).
 */
export type Part =
  /** A slender rod or beam between two points (its depth is neglected). */
  | { kind: 'rod'; massKg: number; fromM: Vec2; toM: Vec2 }
  /** A concentrated mass: a rider, a fitting. */
  | { kind: 'point'; massKg: number; atM: Vec2 }
  | { kind: 'disc'; massKg: number; centreM: Vec2; radiusM: number }
  | { kind: 'ring'; massKg: number; centreM: Vec2; radiusM: number }
  | { kind: 'sphere'; massKg: number; centreM: Vec2; radiusM: number }
  /** A rectangular plate in the plane of motion (a gondola shell side, a platform). */
  | { kind: 'plate'; massKg: number; centreM: Vec2; widthM: number; heightM: number }
  /** A counterweight block; a point mass when its size is not given. */
  | { kind: 'counterweight'; massKg: number; centreM: Vec2; widthM?: number; heightM?: number }
  /** Anything with known properties from a drawing or a maker's data sheet. */
  | { kind: 'custom'; massKg: number; cgM: Vec2; inertiaCgKgM2: number };

export type MassProperties = { massKg: number; cgM: [number, number]; inertiaCgKgM2: number };

/** A part's mass, centre and inertia about its own centre. */
export function partProperties(part: Part): MassProperties {
  const m = part.massKg;
  switch (part.kind) {
    case 'rod': {
      const dx = part.toM[0] - part.fromM[0];
      const dy = part.toM[1] - part.fromM[1];
      const mid: [number, number] = [(part.fromM[0] + part.toM[0]) / 2, (part.fromM[1] + part.toM[1]) / 2];
      return { massKg: m, cgM: mid, inertiaCgKgM2: (m * (dx * dx + dy * dy)) / 12 };
    }
    case 'point':
      return { massKg: m, cgM: [part.atM[0], part.atM[1]], inertiaCgKgM2: 0 };
    case 'disc':
      return { massKg: m, cgM: [...part.centreM], inertiaCgKgM2: (m * part.radiusM ** 2) / 2 };
    case 'ring':
      return { massKg: m, cgM: [...part.centreM], inertiaCgKgM2: m * part.radiusM ** 2 };
    case 'sphere':
      return { massKg: m, cgM: [...part.centreM], inertiaCgKgM2: (2 * m * part.radiusM ** 2) / 5 };
    case 'plate':
      return {
        massKg: m,
        cgM: [...part.centreM],
        inertiaCgKgM2: (m * (part.widthM ** 2 + part.heightM ** 2)) / 12,
      };
    case 'counterweight': {
      const w = part.widthM ?? 0;
      const h = part.heightM ?? 0;
      return { massKg: m, cgM: [...part.centreM], inertiaCgKgM2: (m * (w * w + h * h)) / 12 };
    }
    case 'custom':
      return { massKg: m, cgM: [...part.cgM], inertiaCgKgM2: part.inertiaCgKgM2 };
  }
}

/** Parallel-axis theorem: inertia about a point at distance d from the centre, I = I_G + m·d². */
export function inertiaAbout(props: MassProperties, pointM: Vec2): number {
  const dx = props.cgM[0] - pointM[0];
  const dy = props.cgM[1] - pointM[1];
  return props.inertiaCgKgM2 + props.massKg * (dx * dx + dy * dy);
}

/** Mass, centre and centroidal inertia of several parts taken as one rigid body. */
export function combineParts(parts: readonly Part[]): MassProperties {
  if (parts.length === 0) throw new Error('A body needs at least one part');
  const props = parts.map(partProperties);
  let mass = 0;
  let mx = 0;
  let my = 0;
  for (const p of props) {
    mass += p.massKg;
    mx += p.massKg * p.cgM[0];
    my += p.massKg * p.cgM[1];
  }
  if (!(mass > 0)) throw new Error('A body needs a positive total mass');
  const cg: [number, number] = [mx / mass, my / mass];
  let inertia = 0;
  for (const p of props) inertia += inertiaAbout(p, cg);
  return { massKg: mass, cgM: cg, inertiaCgKgM2: inertia };
}

/** A chain body from its parts. */
export function bodyFromParts(name: string, parts: readonly Part[], tipM?: Vec2): ChainBody {
  const props = combineParts(parts);
  return tipM ? { name, ...props, tipM } : { name, ...props };
}

/**
 * Centre of percussion of a body pivoted at its origin: the distance q = I_O / (m·r_G) from the pivot,
 * along the line to the centre of gravity, where a blow leaves no reaction at the pivot.
 */
export function centreOfPercussion(props: MassProperties): number {
  const rG = Math.hypot(props.cgM[0], props.cgM[1]);
  if (rG === 0) return Infinity;
  return inertiaAbout(props, [0, 0]) / (props.massKg * rG);
}
