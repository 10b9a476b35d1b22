/**
 * Load cases: the ride cycle plus its stops. A service stop brings every joint that has a service
 * deceleration to rest from full speed at that (design) deceleration; an emergency stop does the same at
 * the maker's emergency value. Each stop is a linear ramp to rest (constant deceleration, the engine's
 * `ramp` profile) lasting |ω|/α; joints without a deceleration for that case keep their operating motion.
 *
 * Where the brake bites matters. A rotating joint can be stopped at any arm angle, so each stop is run from
 * START_ANGLES evenly spaced start angles of the first rotating joint (other rotating joints that stop keep
 * their operating phase to it: a level-keeping gondola stays level) and then, for each pivot, refined by a
 * parabolic search around its worst start angle (for a rod braked from steady rotation the worst force is
 * at the start of the stop with the weight lined up with the centripetal and tangential terms; the search
 * finds that angle to well under 0.1°). A swinging joint is stopped where it is fastest, at the centre of
 * its swing, in both directions. Joints without a deceleration keep their operating profile from its own
 * start. Each envelope item keeps the worst ratio over all runs of all cases and says which case governs.
 * Motion and wear items (rate, amplitude, pin wear, clearance) come from the operating cycle only: a stop
 * adds nothing to them. A stop's joint torque is the brake's: reported with its case, not held against the
 * drive torque limit.
 *
 * Pure TypeScript: the server, the phone's preview and the calculator run this same code.
 */
import {
  type CycleInput,
  type CycleResult,
  type CycleWarning,
  type EnvelopeItem,
  type EnvelopeStatus,
  type LoadCaseKind,
  type MotionProfile,
  analyseCycle,
  worstStatus,
} from '@/features/loads/engine';
import type { DesignData } from '@/features/loads/design-schema';
import { formatRatio } from '@/features/loads/format';
import type { QuantityKind } from '@/lib/units';

export type { LoadCaseKind };

/** One joint's stop decelerations, rad/s² (positive). A joint not listed keeps its motion in every stop. */
export type StopSpec = { joint: number; serviceDecelRadS2?: number; emergencyDecelRadS2?: number };

/** The stop decelerations a ride's design data gives, per joint. */
export function designStops(d: DesignData): StopSpec[] {
  return d.motion
    .filter((m) => m.serviceDecelRadS2 !== undefined || m.emergencyDecelRadS2 !== undefined)
    .map((m) => ({
      joint: m.joint,
      serviceDecelRadS2: m.serviceDecelRadS2,
      emergencyDecelRadS2: m.emergencyDecelRadS2,
    }));
}

/** Evenly spaced start angles tried for a rotating joint before each pivot's worst is refined. */
export const START_ANGLES = 12;
const REFINE_STEPS = 4;
/**
 * Instants per stop run. A stop's peaks come where the brake bites (t = 0, always a sample) or follow the
 * slowing motion smoothly, so a stop needs fewer instants than a cycle.
 */
export const STOP_SAMPLES = 121;
const RAD_S_TO_RPM = 60 / (2 * Math.PI);
/** Share of a ramp that lies before t = 0, so the first sample already decelerates. */
const BITE = 1e-9;

export const LOAD_CASE_LABEL: Record<LoadCaseKind, string> = {
  operating: 'Operating cycle',
  service_stop: 'Service stop',
  emergency_stop: 'Emergency stop',
};

export type CaseSummary = {
  kind: LoadCaseKind;
  label: string;
  /** Per joint: the deceleration applied in rad/s², null where the joint keeps its operating motion. */
  decelRadS2: (number | null)[];
  durationS: number;
  /** How many cycles were analysed for this case (start angles × directions, refinement included). */
  runs: number;
  /** Peaks over all runs of the case. */
  joints: { name: string; peakForceN: number; peakTorqueNm: number }[];
  seats: { name: string; gxMin: number; gxMax: number; gzMin: number; gzMax: number }[];
  /** Worst status of this case's own envelope items; null when the design defines none. */
  status: EnvelopeStatus | null;
  /** The run holding this case's worst item (else its largest main-pivot force), whole, for charts. */
  run: CycleResult;
  /** Every run of the case, whole: fatigue counts each (features/fatigue/detail-damage.ts). */
  results: readonly CycleResult[];
};

export type LoadCasesResult = {
  operating: CycleResult;
  /** The operating cycle first, then each stop the data defines. */
  cases: CaseSummary[];
  /** Every item at its worst over the cases, with `loadCase` naming the case it comes from. */
  envelope: EnvelopeItem[];
  status: EnvelopeStatus;
  /** The case of the item using most of its allowance; null without envelope items. */
  governing: LoadCaseKind | null;
  /** The operating cycle's warnings, then the stops'. */
  warnings: CycleWarning[];
};

/**
 * Quantities a stop can raise; the rest (rate, amplitude, wear) are the operating cycle's. The joint torque
 * in a stop is the brake's, not the drive's: it is reported with the case but not held against the drive
 * torque limit (a brake is rated by its maker, outside the design data).
 */
const stopQuantities: ReadonlySet<QuantityKind> = new Set<QuantityKind>([
  'force',
  'stress',
  'pressure',
  'accel',
]);
// A pin check (EN 1993-1-8 Table 3.10) follows the pivot force whatever its quantity (the pin's bending
// moment too): a stop that raises the force raises every check, so the merged item is the peak over cases.
const fromStops = (e: EnvelopeItem) =>
  (stopQuantities.has(e.quantity) && !/\.pin\.(diameter|clearance)$/.test(e.id)) ||
  /\.pin\.en1993\./.test(e.id);

/** NaN is unreadable, so it counts as the worst. */
const ratioOf = (e: Pick<EnvelopeItem, 'ratio'>) => (Number.isNaN(e.ratio) ? Infinity : e.ratio);

/** The envelope item using most of its allowance (an unreadable one first): its case governs. */
export function governingItem<T extends Pick<EnvelopeItem, 'ratio'>>(envelope: readonly T[]): T | null {
  let top: T | null = null;
  for (const e of envelope) if (!top || ratioOf(e) > ratioOf(top)) top = e;
  return top;
}

/** How a joint stops: from steady rotation (start angle swept) or at the centre of its swing (two ways). */
type Stopper = {
  joint: number;
  decel: number;
  rotating: boolean;
  /** Signed full speed, rad/s (for a swing, its peak rate, turned by the direction). */
  rateRadS: number;
  startAngleRad: number;
  rampS: number;
};

/** The operating motion of each stopping joint, read from the operating cycle itself. */
function stoppers(
  input: CycleInput,
  operating: CycleResult,
  stops: readonly StopSpec[],
  key: 'serviceDecelRadS2' | 'emergencyDecelRadS2',
): Stopper[] {
  const out: Stopper[] = [];
  for (const s of stops) {
    const decel = s[key];
    const joint = operating.joints[s.joint];
    if (decel === undefined || !(decel > 0) || !joint) continue;
    const profile = input.profiles[s.joint];
    if (profile.kind === 'fixed') continue;
    const rate = joint.rateRadS;
    let k = 0;
    for (let i = 1; i < rate.length; i++) if (Math.abs(rate[i]) > Math.abs(rate[k])) k = i;
    const full = rate[k];
    if (!(Math.abs(full) > 1e-9)) continue;
    let lo = Infinity;
    let hi = -Infinity;
    for (const a of joint.angleRad) {
      lo = Math.min(lo, a);
      hi = Math.max(hi, a);
    }
    // A joint that turns a whole revolution in the cycle rotates, whatever its profile (a measured one).
    const rotating =
      profile.kind === 'constant' ||
      profile.kind === 'ramp' ||
      joint.amplitudeRad === null ||
      hi - lo >= 2 * Math.PI * (1 - 1e-9);
    out.push({
      joint: s.joint,
      decel,
      rotating,
      rateRadS: rotating ? full : Math.abs(full),
      startAngleRad: rotating ? joint.angleRad[0] : (lo + hi) / 2,
      rampS: Math.abs(full) / decel,
    });
  }
  return out;
}

/** One stop run: stopping joints ramp to rest, rotating ones from `offset`, swinging ones in `direction`. */
function stopInput(
  input: CycleInput,
  list: readonly Stopper[],
  durationS: number,
  offset: number,
  direction: 1 | -1,
): CycleInput {
  const profiles: MotionProfile[] = input.profiles.slice();
  // Rotating joints keep their operating phase to one another (a wheel's level-keeping gondola, a sub-arm
  // geared to its arm): the brake bites after the first one has turned `offset`, the others in proportion.
  const reference = list.find((s) => s.rotating)?.rateRadS ?? 1;
  for (const s of list) {
    const rate = s.rotating ? s.rateRadS : direction * s.rateRadS;
    profiles[s.joint] = {
      kind: 'ramp',
      fromRpm: rate * RAD_S_TO_RPM,
      toRpm: 0,
      rampTimeS: s.rampS,
      // The profile counts the instant a ramp starts to the hold before it (no deceleration yet). The
      // brake bites at t = 0 here, the stop's worst instant, so the ramp starts a hair earlier.
      holdBeforeS: -BITE * s.rampS,
      holdAfterS: Math.max(0, durationS - s.rampS),
      startAngleRad: s.rotating ? s.startAngleRad + (offset * s.rateRadS) / reference : s.startAngleRad,
      shape: 'linear',
    };
  }
  return { ...input, profiles, durationS, samples: Math.min(input.samples ?? STOP_SAMPLES, STOP_SAMPLES) };
}

/**
 * Successive parabolic interpolation (as in Brent's method) for the start angle giving joint `j` its
 * largest force: a parabola through the coarse worst and its two neighbours, then through the best three
 * points found so far, REFINE_STEPS times. Near a smooth maximum it converges faster than linearly, so a
 * few runs reach well under 0.1°; where the peak is not smooth it never does worse than the sweep.
 */
function refine(
  run: (offset: number) => CycleResult,
  sweep: readonly { offset: number; result: CycleResult }[],
  k: number,
  j: number,
): CycleResult[] {
  const runs: CycleResult[] = [];
  const count = sweep.length;
  const step = (2 * Math.PI) / count;
  const at = (i: number) => sweep[(i + count) % count].result.joints[j].peakForce.value;
  // Points as (offset, force), offsets unwrapped around the coarse worst.
  const points = [-1, 0, 1].map((d) => ({ x: sweep[k].offset + d * step, f: at(k + d) }));
  for (let i = 0; i < REFINE_STEPS; i++) {
    points.sort((a, b) => a.x - b.x);
    const [a, b, c] = points;
    const den = (b.x - a.x) * (b.f - c.f) - (b.x - c.x) * (b.f - a.f);
    if (!(Math.abs(den) > 0)) break;
    const num = (b.x - a.x) ** 2 * (b.f - c.f) - (b.x - c.x) ** 2 * (b.f - a.f);
    const x = b.x - (0.5 * num) / den;
    // Stay inside the bracket and off the points already run.
    if (!(x > a.x && x < c.x) || Math.abs(x - b.x) < 1e-7) break;
    const result = run(x);
    runs.push(result);
    points.push({ x, f: result.joints[j].peakForce.value });
    // Keep the best point with its nearest neighbour on each side.
    points.sort((p, q) => q.f - p.f);
    const best = points[0];
    const left = points.filter((p) => p.x < best.x).sort((p, q) => q.x - p.x)[0];
    const right = points.filter((p) => p.x > best.x).sort((p, q) => p.x - q.x)[0];
    if (!left || !right) break;
    points.splice(0, points.length, left, best, right);
  }
  return runs;
}

/** Every run of one stop case: the start-angle sweep (with refinement) in each direction. */
function stopRuns(input: CycleInput, list: readonly Stopper[]): { runs: CycleResult[]; durationS: number } {
  const durationS = Math.max(...list.map((s) => s.rampS));
  const rotating = list.some((s) => s.rotating);
  const swinging = list.some((s) => !s.rotating);
  const runs: CycleResult[] = [];
  for (const direction of swinging ? ([1, -1] as const) : ([1] as const)) {
    const run = (offset: number) => analyseCycle(stopInput(input, list, durationS, offset, direction));
    if (!rotating) {
      runs.push(run(0));
      continue;
    }
    const step = (2 * Math.PI) / START_ANGLES;
    const sweep = Array.from({ length: START_ANGLES }, (_, k) => ({
      offset: k * step,
      result: run(k * step),
    }));
    runs.push(...sweep.map((s) => s.result));
    const n = sweep[0].result.joints.length;
    for (let j = 0; j < n; j++) {
      let best = sweep[0];
      for (const s of sweep)
        if (s.result.joints[j].peakForce.value > best.result.joints[j].peakForce.value) best = s;
      if (best.result.joints[j].peakForce.value > 0) runs.push(...refine(run, sweep, sweep.indexOf(best), j));
    }
  }
  return { runs, durationS };
}

/** The case's own envelope: each item at its worst over the runs. */
function worstItems(runs: readonly CycleResult[], kind: LoadCaseKind, only?: (e: EnvelopeItem) => boolean) {
  const byId = new Map<string, { item: EnvelopeItem; run: CycleResult }>();
  for (const run of runs)
    for (const e of run.envelope) {
      if (only && !only(e)) continue;
      const held = byId.get(e.id);
      if (!held || ratioOf(e) > ratioOf(held.item)) byId.set(e.id, { item: { ...e, loadCase: kind }, run });
    }
  return byId;
}

function summarise(
  kind: LoadCaseKind,
  runs: readonly CycleResult[],
  decelRadS2: (number | null)[],
  items: Map<string, { item: EnvelopeItem; run: CycleResult }>,
): CaseSummary {
  const first = runs[0];
  const joints = first.joints.map((j, i) => {
    let peakForceN = 0;
    let peakTorqueNm = 0;
    for (const r of runs) {
      peakForceN = Math.max(peakForceN, r.joints[i].peakForce.value);
      const t = r.joints[i].peakTorque.value;
      if (Math.abs(t) > Math.abs(peakTorqueNm)) peakTorqueNm = t;
    }
    return { name: j.name, peakForceN, peakTorqueNm };
  });
  const seats = first.seats.map((s, i) => ({
    name: s.name,
    gxMin: Math.min(...runs.map((r) => r.seats[i].extremes.gx.min)),
    gxMax: Math.max(...runs.map((r) => r.seats[i].extremes.gx.max)),
    gzMin: Math.min(...runs.map((r) => r.seats[i].extremes.gz.min)),
    gzMax: Math.max(...runs.map((r) => r.seats[i].extremes.gz.max)),
  }));
  let worst: { item: EnvelopeItem; run: CycleResult } | undefined;
  for (const held of items.values()) if (!worst || ratioOf(held.item) > ratioOf(worst.item)) worst = held;
  let run = worst?.run ?? first;
  if (!worst)
    for (const r of runs)
      if ((r.joints[0]?.peakForce.value ?? 0) > (run.joints[0]?.peakForce.value ?? 0)) run = r;
  return {
    kind,
    label: LOAD_CASE_LABEL[kind],
    decelRadS2,
    durationS: first.durationS,
    runs: runs.length,
    joints,
    seats,
    status: items.size ? worstStatus([...items.values()].map((h) => h.item.status)) : null,
    run,
    results: runs,
  };
}

const degrees = (rad: number) => `${((rad * 180) / Math.PI).toFixed(0)}°`;

/**
 * The operating cycle and every stop the specs define, merged: each envelope item at its worst over the
 * cases, naming the case that governs it. A stop that cannot be analysed (a measured record shorter than
 * the stop, say) is left out with a warning rather than failing the whole analysis.
 */
export function analyseLoadCases(input: CycleInput, stops: readonly StopSpec[]): LoadCasesResult {
  const operating = analyseCycle(input);
  const n = operating.joints.length;
  const warnings: CycleWarning[] = [...operating.warnings];
  const operatingItems = worstItems([operating], 'operating');
  const cases: CaseSummary[] = [summarise('operating', [operating], Array(n).fill(null), operatingItems)];
  const merged = new Map(operatingItems);

  const kinds = [
    ['service_stop', 'serviceDecelRadS2'],
    ['emergency_stop', 'emergencyDecelRadS2'],
  ] as const;
  for (const [kind, key] of kinds) {
    const list = stoppers(input, operating, stops, key);
    if (list.length === 0) continue;
    const label = LOAD_CASE_LABEL[kind];
    for (const s of list) {
      const amplitude = operating.joints[s.joint].amplitudeRad;
      const travel = (s.rateRadS * s.rateRadS) / (2 * s.decel);
      if (!s.rotating && amplitude !== null && travel > amplitude)
        warnings.push({
          code: 'stop_travel',
          level: 'warning',
          joint: s.joint,
          message:
            `${label}, ${operating.joints[s.joint].name}: at ${s.decel} rad/s² a swing at ` +
            `${Math.abs(s.rateRadS).toFixed(2)} rad/s needs ${degrees(travel)} to stop, beyond its ` +
            `${degrees(amplitude)} amplitude. The deceleration looks low for a swing: check the design value.`,
        });
    }
    let runs: CycleResult[];
    try {
      runs = stopRuns(input, list).runs;
    } catch (err) {
      warnings.push({
        code: 'load_case_failed',
        level: 'warning',
        message: `${label} could not be analysed: ${err instanceof Error ? err.message : String(err)}`,
      });
      continue;
    }
    const items = worstItems(runs, kind, fromStops);
    const decel: (number | null)[] = Array(n).fill(null);
    for (const s of list) decel[s.joint] = s.decel;
    cases.push(summarise(kind, runs, decel, items));
    for (const [id, held] of items) {
      const current = merged.get(id);
      if (!current || ratioOf(held.item) > ratioOf(current.item)) merged.set(id, held);
    }
    const seen = new Set<string>();
    for (const r of runs)
      for (const w of r.warnings) {
        const k = `${w.code}|${w.joint}|${w.seat}|${w.message}`;
        if (seen.has(k)) continue;
        seen.add(k);
        warnings.push({ ...w, message: `${label}: ${w.message}` });
      }
  }

  // The operating order first (it lists every item), then anything only a stop has. Without stops the
  // result is the single cycle's, untagged, exactly as analyseCycle gives it.
  const envelope = cases.length > 1 ? [...merged.values()].map((h) => h.item) : operating.envelope;
  const top = governingItem(envelope);
  const governing: LoadCaseKind | null = top ? (top.loadCase ?? 'operating') : null;
  return {
    operating,
    cases,
    envelope,
    status: worstStatus(envelope.map((e) => e.status)),
    governing,
    warnings,
  };
}

/** The merged result as one cycle result: the operating histories with the cases' envelope and warnings. */
export function withLoadCases(r: LoadCasesResult): CycleResult {
  return { ...r.operating, envelope: r.envelope, status: r.status, warnings: r.warnings };
}

/** "Governing case: Emergency stop (P1 pivot force at 87 % of its limit)." */
export function governingText(
  governing: LoadCaseKind | null,
  envelope: readonly Pick<EnvelopeItem, 'label' | 'ratio'>[] | undefined,
): string {
  if (!governing) return '';
  const top = envelope ? governingItem(envelope) : null;
  const why = !top
    ? ''
    : Number.isFinite(top.ratio)
      ? ` (${top.label} at ${formatRatio(top.ratio)} of its limit)`
      : ` (${top.label}: no allowance left, or unreadable)`;
  return `Governing case: ${LOAD_CASE_LABEL[governing]}${why}.`;
}
