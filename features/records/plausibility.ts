/**
 * Is a motion reading anywhere near the ride's design motion? A period tapped at the wrong mark (one pass
 * instead of there and back, or a missed pass) gives half or twice the real value, and the load check
 * then reports loads the ride never sees — or misses ones it does. A reading more than 1.5 times or under
 * 0.5 times its design value is held back until the inspector confirms it or measures again. Pure (no
 * React): the phone asks with it and the server refuses unconfirmed records with it.
 *
 * What "design value" means for each motion kind of the joint (`DesignMotion`):
 *  - constant (a wheel, a rotor): the design speed |rpm|. A speed reading compares directly; a period
 *    reading is one revolution, so it compares as a rate, 1 / period (a period of 2 s where the design is
 *    4 s is twice the design rate). Speed and period therefore give the same verdict for the same motion.
 *  - swing (a pendulum): the design period (one full swing, there and back) and the design amplitude
 *    (each side of centre). A period compares as a rate, as above; an amplitude compares directly.
 *  - fixed (held): no design rate exists, and the load check does not use motion readings on a held joint
 *    (`measuredInputs`), so they are not checked here. Nor are readings the load check ignores on the
 *    other kinds (an amplitude on a turning joint, a speed on a swinging one), nor a design value of 0.
 * Typed and timed readings are checked alike: both replace the design motion in the load check.
 */
import type { DesignData, DesignMotion } from '@/features/loads/design-schema';
import type { ConfirmedOutOfRange, MotionReadingKind } from '@/features/records/schema';

export const PLAUSIBLE_LOW = 0.5;
export const PLAUSIBLE_HIGH = 1.5;
/**
 * A reading typed in rpm or degrees is converted to SI and back; without a little room a value typed at
 * exactly 1.5 × the design value could land a rounding error past the boundary.
 */
const ROUNDING = 1e-9;

export type PlausibilityCheck = {
  kind: MotionReadingKind;
  /** The design value in the reading's own SI unit: rad/s for speed, s for period, rad for amplitude. */
  designSI: number;
  /**
   * How the reading's motion compares with the design: measured rate ÷ design rate for speed and period
   * (for a period: design period ÷ measured period), measured ÷ design for amplitude. 1 = as designed.
   */
  ratio: number;
  plausible: boolean;
};

type ReadingLike = { kind: string; joint: number | null; valueSI: number };

const rpmToRadS = (rpm: number) => (rpm * 2 * Math.PI) / 60;

/** The design value a reading of `kind` is compared with on a joint of this motion; null: not checked. */
export function designValueSI(motion: DesignMotion | undefined, kind: string): number | null {
  if (!motion) return null;
  let v: number | undefined;
  if (motion.kind === 'constant' && motion.rpm !== undefined) {
    if (kind === 'speed') v = rpmToRadS(Math.abs(motion.rpm));
    if (kind === 'period') v = motion.rpm === 0 ? undefined : 60 / Math.abs(motion.rpm);
  } else if (motion.kind === 'swing') {
    if (kind === 'period') v = motion.periodS;
    if (kind === 'amplitude') v = motion.amplitudeRad;
  }
  return v !== undefined && Number.isFinite(v) && v > 0 ? v : null;
}

function isPlausibleRatio(ratio: number): boolean {
  return ratio >= PLAUSIBLE_LOW * (1 - ROUNDING) && ratio <= PLAUSIBLE_HIGH * (1 + ROUNDING);
}

/** The check of one reading against its joint's design motion; null when the reading is not checked. */
export function checkReading(
  motion: DesignMotion | undefined,
  reading: ReadingLike,
): PlausibilityCheck | null {
  const kind = reading.kind;
  if (kind !== 'speed' && kind !== 'period' && kind !== 'amplitude') return null;
  const designSI = designValueSI(motion, kind);
  if (designSI === null || !Number.isFinite(reading.valueSI)) return null;
  const measured = Math.abs(reading.valueSI);
  // A zero period would be an infinite rate: the schema and the form refuse it; say "implausible" anyway.
  if (kind === 'period' && measured === 0) return { kind, designSI, ratio: Infinity, plausible: false };
  const ratio = kind === 'period' ? designSI / measured : measured / designSI;
  return { kind, designSI, ratio, plausible: isPlausibleRatio(ratio) };
}

function motionOfJoint(design: DesignData, joint: number | null): DesignMotion | undefined {
  return joint === null ? undefined : design.motion.find((m) => m.joint === joint);
}

/** The check of one reading against the ride's design data. */
export function checkAgainstDesign(design: DesignData, reading: ReadingLike): PlausibilityCheck | null {
  return checkReading(motionOfJoint(design, reading.joint), reading);
}

/** Readings far from the design motion that carry no confirmation, with their index in the list. */
export function unconfirmedImplausible<R extends ReadingLike & { plausibility?: unknown }>(
  design: DesignData,
  readings: readonly R[],
): { index: number; reading: R; check: PlausibilityCheck }[] {
  const out: { index: number; reading: R; check: PlausibilityCheck }[] = [];
  readings.forEach((reading, index) => {
    if (reading.plausibility) return;
    const check = checkAgainstDesign(design, reading);
    if (check && !check.plausible) out.push({ index, reading, check });
  });
  return out;
}

const deg = (rad: number) => (rad * 180) / Math.PI;
const num = (x: number, digits: number) => (Number.isFinite(x) ? x.toFixed(digits) : 'unbounded');

/** The design value in the words and units the field uses (rpm, s, °: the same in SI and US units). */
function designValueText(check: Pick<PlausibilityCheck, 'kind' | 'designSI'>): string {
  if (check.kind === 'speed') return `design speed ${num((check.designSI * 60) / (2 * Math.PI), 2)} rpm`;
  if (check.kind === 'period') return `design period ${num(check.designSI, 2)} s`;
  return `design amplitude ${num(deg(check.designSI), 1)}°`;
}

/**
 * One sentence on how far the reading is from the design: "3.93 × the design rate (design period 9.50 s)".
 * A period is described as a rate, since that is what the ratio compares.
 */
export function plausibilityText(check: PlausibilityCheck): string {
  const what = check.kind === 'amplitude' ? 'the design amplitude' : 'the design rate';
  return `${num(check.ratio, 2)} × ${what} (${designValueText(check)})`;
}

/** A reading with what the server's analysis needs to report a confirmed out-of-range value. */
type ConfirmableReading = ReadingLike & {
  id: string;
  label: string;
  plausibility?: { confirmedAt: string; note?: string };
};

/**
 * The confirmed readings that are out of range against `design` (the analysis's design data, which is
 * the one the record was checked against at ingest), each marked with whether the load check used it:
 * the latest reading of its kind on its joint, and for a turning joint a period only when no speed was
 * read (features/records/analysis.ts, `measuredInputs`).
 */
export function confirmedOutOfRange(
  design: DesignData,
  readings: readonly ConfirmableReading[],
): ConfirmedOutOfRange[] {
  const last = new Map<string, string>();
  for (const r of readings) last.set(`${r.kind}:${r.joint}`, r.id);
  const out: ConfirmedOutOfRange[] = [];
  for (const r of readings) {
    if (!r.plausibility) continue;
    const check = checkAgainstDesign(design, r);
    if (!check || check.plausible) continue;
    const turning = design.motion.find((m) => m.joint === r.joint)?.kind === 'constant';
    const used =
      last.get(`${r.kind}:${r.joint}`) === r.id &&
      !(turning && r.kind === 'period' && last.has(`speed:${r.joint}`));
    out.push({
      readingId: r.id,
      label: r.label,
      kind: check.kind,
      valueSI: r.valueSI,
      designSI: check.designSI,
      ratio: check.ratio,
      confirmedAt: r.plausibility.confirmedAt,
      ...(r.plausibility.note ? { note: r.plausibility.note } : {}),
      usedByLoadCheck: used,
    });
  }
  return out;
}
