/**
 * The load-check calculator's form model: what a person types (strings, in display units) turned into
 * the engine's cycle request (SI). Pure TypeScript so it is tested without a screen.
 */
import { zodIssues } from '@/lib/api-errors';
import { type CycleResult, type MotionProfile, analyseCycle } from '@/features/loads/engine';
import { cycleRequestSchema } from '@/features/loads/schema';
import {
  type DesignData,
  type DesignMotion,
  designBodies,
  designToCycleInput,
} from '@/features/loads/design-schema';
import { toSI } from '@/lib/units';

export type MotionKind = 'constant' | 'swing' | 'ramp' | 'fixed';

export type MotionRow = {
  kind: MotionKind;
  rpm: string;
  amplitudeDeg: string;
  periodS: string;
  angleDeg: string;
  rampS: string;
};

export type BodyRow = {
  name: string;
  massKg: string;
  cgX: string;
  cgY: string;
  inertia: string;
  tipX: string;
  tipY: string;
};

const CALCULATOR_SAMPLES = 720;

export const motionKindLabel: Record<MotionKind, string> = {
  constant: 'Steady speed',
  swing: 'Swing',
  ramp: 'Spin-up',
  fixed: 'Held',
};

const blankMotion: MotionRow = {
  kind: 'fixed',
  rpm: '',
  amplitudeDeg: '',
  periodS: '',
  angleDeg: '0',
  rampS: '',
};

/** A starting chain for manual entry: a 10 m arm carrying a gondola (round numbers, not a real ride). */
export function exampleBodies(): BodyRow[] {
  return [
    { name: 'Arm', massKg: '4000', cgX: '5', cgY: '0', inertia: '33333', tipX: '10', tipY: '0' },
    { name: 'Gondola', massKg: '1500', cgX: '0', cgY: '-1.5', inertia: '1200', tipX: '', tipY: '' },
  ];
}

export function exampleMotion(): MotionRow[] {
  return [
    { ...blankMotion, kind: 'constant', rpm: '8' },
    { ...blankMotion, kind: 'swing', amplitudeDeg: '15', periodS: '4' },
  ];
}

export function newBody(index: number): BodyRow {
  return { name: `Body ${index + 1}`, massKg: '', cgX: '', cgY: '', inertia: '', tipX: '', tipY: '' };
}

export function newMotion(): MotionRow {
  return { ...blankMotion };
}

const deg = (v: number) => toSI(v, 'angle', 'deg');
const radToDeg = (v: number) => (v * 180) / Math.PI;
const fmt = (v: number | undefined) => (v === undefined ? '' : String(+v.toPrecision(6)));

/** A design motion as the calculator's editable row (design values prefilled). */
export function motionRowFromDesign(m: DesignMotion | undefined): MotionRow {
  if (!m) return newMotion();
  return {
    kind: m.kind,
    rpm: fmt(m.rpm),
    amplitudeDeg: fmt(m.amplitudeRad === undefined ? undefined : radToDeg(m.amplitudeRad)),
    periodS: fmt(m.periodS),
    angleDeg: fmt(m.angleRad === undefined ? 0 : radToDeg(m.angleRad)),
    rampS: '',
  };
}

/** Empty text is "missing", so validation names it instead of treating it as 0. */
function parse(text: string): number | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '') return undefined;
  const v = Number(t);
  return Number.isFinite(v) ? v : NaN;
}

/** A motion row as an engine profile; unparseable numbers pass through so the schema reports them. */
export function profileFromRow(row: MotionRow): MotionProfile {
  const n = (t: string) => parse(t) as number;
  switch (row.kind) {
    case 'constant':
      return { kind: 'constant', rpm: n(row.rpm) };
    case 'swing':
      return { kind: 'swing', amplitudeRad: deg(n(row.amplitudeDeg)), periodS: n(row.periodS) };
    case 'ramp':
      // Spin up over the ramp time, then a full turn at the target speed so the peak is seen.
      return {
        kind: 'ramp',
        toRpm: n(row.rpm),
        rampTimeS: n(row.rampS),
        holdAfterS: Math.abs(n(row.rpm)) > 0 ? 60 / Math.abs(n(row.rpm)) : 0,
        shape: 'smooth',
      };
    case 'fixed':
      return { kind: 'fixed', angleRad: deg(n(row.angleDeg)) };
  }
}

function bodiesFromRows(rows: BodyRow[]) {
  return rows.map((r, i) => {
    const tipX = parse(r.tipX);
    const tipY = parse(r.tipY);
    const last = i === rows.length - 1;
    return {
      name: r.name,
      massKg: parse(r.massKg),
      cgM: [parse(r.cgX), parse(r.cgY)],
      inertiaCgKgM2: parse(r.inertia),
      ...(!last || tipX !== undefined || tipY !== undefined
        ? { tipM: tipX === undefined && tipY === undefined ? undefined : [tipX, tipY] }
        : {}),
    };
  });
}

/** The request for a registered ride: its design chain and envelope, with the motion as entered. */
export function rideRequest(design: DesignData, motion: MotionRow[]): unknown {
  return designToCycleInput(design, { profiles: motion.map(profileFromRow) }, CALCULATOR_SAMPLES);
}

/** The request for a chain typed in by hand: no envelope, so no statuses beyond the raw results. */
export function manualRequest(bodies: BodyRow[], motion: MotionRow[]): unknown {
  return {
    bodies: bodiesFromRows(bodies),
    profiles: motion.map(profileFromRow),
    samples: CALCULATOR_SAMPLES,
  };
}

/** Body names of a design, for labelling motion rows. */
export function designBodyNames(design: DesignData): string[] {
  return designBodies(design).map((b) => b.name);
}

export type CalculatorOutcome =
  | { ok: true; result: CycleResult; xAxis: 'angle' | 'time' }
  | { ok: false; issues: { path: string; message: string }[] };

/** Validates with the same schema the server uses, then runs the engine on the device. */
export function runCalculator(request: unknown): CalculatorOutcome {
  const parsed = cycleRequestSchema.safeParse(request);
  if (!parsed.success) return { ok: false, issues: zodIssues(parsed.error) };
  const result = analyseCycle(parsed.data);
  // Force against the main arm's angle reads best when the arm turns steadily; otherwise against time.
  return { ok: true, result, xAxis: parsed.data.profiles[0]?.kind === 'constant' ? 'angle' : 'time' };
}
