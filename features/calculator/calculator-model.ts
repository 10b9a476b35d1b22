/**
 * The load-check calculator's form model: what a person types (strings, in display units) turned into
 * the engine's cycle request (SI). Pure TypeScript so it is tested without a screen.
 */
import { zodIssues } from '@/lib/api-errors';
import { type CycleResult, type MotionProfile, analyseCycle } from '@/features/loads/engine';
import {
  type CaseSummary,
  type LoadCasesResult,
  type StopSpec,
  analyseLoadCases,
  withLoadCases,
} from '@/features/loads';
import { cycleRequestSchema } from '@/features/loads/schema';
import {
  type DesignData,
  type DesignMotion,
  designBodies,
  designToCycleInput,
} from '@/features/loads/design-schema';
import { toSI } from '@/lib/units';
import { type RecordColumn, parseRecord } from '@/features/calculator/csv-record';

export type MotionKind = 'constant' | 'swing' | 'ramp' | 'fixed' | 'free' | 'measured';

/** How a measured record is smoothed: chosen by the engine from the record, or at a typed cut-off. */
export type Smoothing = 'auto' | 'cutoff';

export type MotionRow = {
  kind: MotionKind;
  rpm: string;
  amplitudeDeg: string;
  periodS: string;
  /** Held: the angle. Free: the angle at the start. Measured rate record: the angle at its first sample. */
  angleDeg: string;
  rampS: string;
  /** Free: the rate at the start in °/s; empty for released from rest. */
  startRateDegS: string;
  /** Measured: the record as text (pasted or read from a file), what its second column is, the file's name. */
  recordText: string;
  recordColumn: RecordColumn;
  recordName: string;
  smoothing: Smoothing;
  cutoffHz: string;
  /** Stopping cases: the service-stop (design) and emergency-stop (maker's) decelerations, rad/s²; empty for none. */
  serviceStop: string;
  emergencyStop: string;
};

type Issue = { path: string; message: string };

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
  free: 'Free swing',
  measured: 'Measured',
};

export const motionKinds: readonly MotionKind[] = ['constant', 'swing', 'ramp', 'fixed', 'free', 'measured'];

const blankMotion: MotionRow = {
  kind: 'fixed',
  rpm: '',
  amplitudeDeg: '',
  periodS: '',
  angleDeg: '0',
  rampS: '',
  startRateDegS: '',
  recordText: '',
  recordColumn: 'angle_deg',
  recordName: '',
  smoothing: 'auto',
  cutoffHz: '',
  serviceStop: '',
  emergencyStop: '',
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
  const amplitudeDeg = fmt(m.amplitudeRad === undefined ? undefined : radToDeg(m.amplitudeRad));
  return {
    ...blankMotion,
    // A free-swinging joint is released from rest at its design amplitude, as the inspection analyses it.
    kind: m.kind === 'swing' && m.freeSwing ? 'free' : m.kind,
    rpm: fmt(m.rpm),
    amplitudeDeg,
    periodS: fmt(m.periodS),
    angleDeg:
      m.kind === 'swing' && m.freeSwing
        ? amplitudeDeg
        : fmt(m.angleRad === undefined ? 0 : radToDeg(m.angleRad)),
    rampS: '',
    serviceStop: fmt(m.serviceDecelRadS2),
    emergencyStop: fmt(m.emergencyDecelRadS2),
  };
}

/** Empty text is "missing", so validation names it instead of treating it as 0. */
function parse(text: string): number | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '') return undefined;
  const v = Number(t);
  return Number.isFinite(v) ? v : NaN;
}

/**
 * A motion row as an engine profile; unparseable numbers pass through so the schema reports them. A
 * measured row's record is read here: its problems (naming the record's lines) come back as issues on
 * `profiles.<joint>.record`, and the profile is then null.
 */
export function profileFromRow(
  row: MotionRow,
  joint = 0,
): { profile: MotionProfile | null; issues: Issue[] } {
  const n = (t: string) => parse(t) as number;
  switch (row.kind) {
    case 'constant':
      return ok({ kind: 'constant', rpm: n(row.rpm) });
    case 'swing':
      return ok({ kind: 'swing', amplitudeRad: deg(n(row.amplitudeDeg)), periodS: n(row.periodS) });
    case 'ramp':
      // Spin up over the ramp time, then a full turn at the target speed so the peak is seen.
      return ok({
        kind: 'ramp',
        toRpm: n(row.rpm),
        rampTimeS: n(row.rampS),
        holdAfterS: Math.abs(n(row.rpm)) > 0 ? 60 / Math.abs(n(row.rpm)) : 0,
        shape: 'smooth',
      });
    case 'fixed':
      return ok({ kind: 'fixed', angleRad: deg(n(row.angleDeg)) });
    case 'free': {
      const rate = parse(row.startRateDegS);
      return ok({
        kind: 'free',
        angleRad: deg(n(row.angleDeg)),
        ...(rate === undefined ? {} : { rateRadS: toSI(rate, 'rate', 'deg/s') }),
      });
    }
    case 'measured':
      return measuredProfile(row, joint);
  }
}

const ok = (profile: MotionProfile) => ({ profile, issues: [] });

function measuredProfile(row: MotionRow, joint: number): { profile: MotionProfile | null; issues: Issue[] } {
  const path = `profiles.${joint}.record`;
  if (row.recordText.trim() === '')
    return { profile: null, issues: [{ path, message: 'Paste a record or pick a file' }] };
  const issues: Issue[] = [];
  let cutoffHz: number | undefined;
  if (row.smoothing === 'cutoff') {
    cutoffHz = parse(row.cutoffHz);
    if (cutoffHz === undefined)
      issues.push({
        path: `profiles.${joint}.cutoffHz`,
        message: 'Give the cut-off in Hz, or choose Automatic',
      });
  }
  const parsed = parseRecord(row.recordText, row.recordColumn);
  if (!parsed.ok) {
    for (const p of parsed.problems) issues.push({ path, message: p.message });
    return { profile: null, issues };
  }
  const start = parse(row.angleDeg);
  const profile: MotionProfile = {
    kind: 'measured',
    timeS: parsed.timeS,
    ...(parsed.quantity === 'angle'
      ? { angleRad: parsed.values }
      : { rateRadS: parsed.values, ...(start ? { startAngleRad: deg(start) } : {}) }),
    ...(cutoffHz === undefined ? {} : { cutoffHz }),
  };
  return { profile: issues.length ? null : profile, issues };
}

/** Every row's profile, and what stops them: a missing profile is a placeholder the schema accepts. */
function profilesFromRows(rows: MotionRow[]): { profiles: MotionProfile[]; issues: Issue[] } {
  const issues: Issue[] = [];
  const profiles = rows.map((row, i) => {
    const r = profileFromRow(row, i);
    issues.push(...r.issues);
    return r.profile ?? { kind: 'fixed' as const, angleRad: 0 };
  });
  return { profiles, issues };
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

/** The same bounds as design data's stop decelerations (features/loads/design-schema.ts). */
const MAX_DECEL_RAD_S2 = 1000;

/** Each joint's stop decelerations as typed; a held joint has none, and a typed one must be a deceleration. */
export function stopsFromRows(rows: MotionRow[]): { stops: StopSpec[]; issues: Issue[] } {
  const stops: StopSpec[] = [];
  const issues: Issue[] = [];
  rows.forEach((row, joint) => {
    const spec: StopSpec = { joint };
    for (const [field, key] of [
      ['serviceStop', 'serviceDecelRadS2'],
      ['emergencyStop', 'emergencyDecelRadS2'],
    ] as const) {
      const v = parse(row[field]);
      if (v === undefined) continue;
      const path = `profiles.${joint}.${key}`;
      if (row.kind === 'fixed')
        issues.push({ path, message: 'A held joint does not move, so it has no stop: leave empty' });
      else if (!(v > 0)) issues.push({ path, message: 'Must be a number greater than 0' });
      else if (v > MAX_DECEL_RAD_S2) issues.push({ path, message: `At most ${MAX_DECEL_RAD_S2} rad/s²` });
      else spec[key] = v;
    }
    if (spec.serviceDecelRadS2 !== undefined || spec.emergencyDecelRadS2 !== undefined) stops.push(spec);
  });
  return { stops, issues };
}

/**
 * What the calculator hands to the engine: the request, the stops to run besides the ride cycle, and the
 * problems found before the schema's.
 */
export type CalculatorRequest = { request: unknown; stops: StopSpec[]; issues: Issue[] };

function withStops(request: unknown, rows: MotionRow[], issues: Issue[]): CalculatorRequest {
  const s = stopsFromRows(rows);
  return { request, stops: s.stops, issues: [...issues, ...s.issues] };
}

/**
 * Smooth motion is seen at 720 instants (every half degree of a turn); a measured record is left to the
 * engine, which samples the cycle as densely as the record was taken.
 */
function samplesFor(profiles: readonly MotionProfile[]): number | undefined {
  return profiles.some((p) => p.kind === 'measured') ? undefined : CALCULATOR_SAMPLES;
}

/** The request for a registered ride: its design chain and envelope, with the motion as entered. */
export function rideRequest(design: DesignData, motion: MotionRow[], cycleS = ''): CalculatorRequest {
  const { profiles, issues } = profilesFromRows(motion);
  const input = designToCycleInput(design, { profiles });
  return withStops({ ...input, samples: samplesFor(profiles), ...duration(cycleS) }, motion, issues);
}

/** The request for a chain typed in by hand: no envelope, so no statuses beyond the raw results. */
export function manualRequest(bodies: BodyRow[], motion: MotionRow[], cycleS = ''): CalculatorRequest {
  const { profiles, issues } = profilesFromRows(motion);
  return withStops(
    { bodies: bodiesFromRows(bodies), profiles, samples: samplesFor(profiles), ...duration(cycleS) },
    motion,
    issues,
  );
}

/**
 * A typed cycle length, when one is given; otherwise the engine's own (the longest natural cycle among
 * the joints, a free swing's period): needed when that is longer than a measured record.
 */
function duration(cycleS: string): { durationS?: number } {
  const v = parse(cycleS);
  return v === undefined ? {} : { durationS: v };
}

/** Body names of a design, for labelling motion rows. */
export function designBodyNames(design: DesignData): string[] {
  return designBodies(design).map((b) => b.name);
}

/** The stop cases run besides the ride cycle, and the case that governs the envelope. */
export type CasesOutcome = Pick<LoadCasesResult, 'governing'> & { cases: CaseSummary[] };

export type CalculatorOutcome =
  | { ok: true; result: CycleResult; xAxis: 'angle' | 'time'; cases: CasesOutcome | null }
  | { ok: false; issues: { path: string; message: string }[] };

/**
 * Validates with the same schema the server uses, then runs the engine on the device. Problems found in
 * a record come first; the schema's own issues about a joint whose record failed are left out (they would
 * be about the placeholder, not about anything the person typed).
 */
export function runCalculator({ request, stops, issues }: CalculatorRequest): CalculatorOutcome {
  const parsed = cycleRequestSchema.safeParse(request);
  if (issues.length > 0 || !parsed.success) {
    const bad = new Set(issues.map((i) => i.path.split('.').slice(0, 2).join('.')));
    const schemaIssues = parsed.success ? [] : zodIssues(parsed.error);
    const kept = schemaIssues.filter(
      (i) =>
        !bad.has(i.path.split('.').slice(0, 2).join('.')) &&
        !(bad.size > 0 && i.path === 'durationS' && /no profile has a cycle length/.test(i.message)),
    );
    return { ok: false, issues: [...issues, ...kept] };
  }
  // Force against the main arm's angle reads best when the arm turns steadily; otherwise against time.
  const xAxis = parsed.data.profiles[0]?.kind === 'constant' ? 'angle' : 'time';
  if (stops.length === 0) return { ok: true, result: analyseCycle(parsed.data), xAxis, cases: null };
  const merged = analyseLoadCases(parsed.data, stops);
  return {
    ok: true,
    result: withLoadCases(merged),
    xAxis,
    cases: { cases: merged.cases, governing: merged.governing },
  };
}
