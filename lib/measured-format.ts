/**
 * One rule for every number Pivotwatch shows, e-mails or prints. Pure TypeScript (no React), so the app,
 * the server's e-mail and the PDF all call the same functions and print the same string.
 *
 * The rule:
 * 1. A value typed by an inspector is echoed exactly as typed (`entered`, e.g. "0.40", "139.05"); its
 *    decimals are its measured precision. Records made before `entered` was kept are shown in their
 *    shortest exact form in the unit they were typed in ("0.4", "139.05"), never padded with zeros.
 * 2. A computed value (loads, accelerations, tapped periods) is shown to COMPUTED_SIGNIFICANT_FIGURES
 *    significant figures; digits left of the point are never rounded away (4731 kN, not 4730 kN). A
 *    value with a stated spread (the tap timer's) is shown to the decimal of the spread's second
 *    significant figure (common practice; JCGM 100:2008 §7.2.6 asks for at most two significant
 *    figures in an uncertainty and the value rounded to match — from memory).
 * 3. Converting units does not invent precision: a typed value shown in another unit system keeps its
 *    resolution — one step of its last digit, converted, then the largest power of ten not larger than
 *    that (never coarser than measured, at most one digit finer). 0.01 mm → 0.000394 in → 4 decimals.
 * 4. Never rounded across a limit: the value is compared with its limit BEFORE rounding (in SI, as the
 *    load engine compares), and when the rounded value and limit would look equal or on the wrong side,
 *    digits are added (to the limit first, since a typed value is never changed) until the comparison
 *    shows. When value and limit are equal, the value says so: "139.0 mm (at the limit)".
 * 5. Design values (limits, nominal sizes) are shown as stated, in their shortest exact form ("≥ 139 mm",
 *    "≤ 0.5 mm"), never padded with zeros; in the other unit system, to four significant figures.
 */
import { type Limit, LIMIT_EQUAL_TOLERANCE } from '@/lib/limits';
import {
  type DisplayUnit,
  type QuantityKind,
  type UnitSystem,
  conversionFactor,
  displayUnits,
  formatSignificant,
  fromSI,
  pickDisplayUnit,
} from '@/lib/units';

/** Computed values: four significant figures (a load of 4731 kN, a rate of 9.450 rpm). */
const COMPUTED_SIGNIFICANT_FIGURES = 4;
/** Shares of a limit, in per cent: three significant figures (87.5 %). */
const RATIO_SIGNIFICANT_FIGURES = 3;
/** Old records without `entered`: a stored value with more significant figures than this was not typed. */
const TYPED_MAX_SIGNIFICANT = 6;
/** Past this many decimals a difference is floating-point noise, not a measurement. */
const MAX_DECIMALS = 15;

export type Relation = 'below' | 'equal' | 'above';

/** Where a measured value came from: the text as typed and the unit it was typed in, or its spread. */
export type MeasuredSource = {
  entered?: string | null;
  /** The unit label the value was typed in ('mm', 'in', 'rpm', 's', '°'). */
  unit?: string | null;
  /** The measurement's own spread (same SI unit as the value), e.g. a tap timer's standard deviation. */
  spreadSI?: number | null;
  /** A measured value whose unit is not known (older records): recover its typed text in the shown unit. */
  recover?: boolean;
};

type MeasuredText = { value: string; unit: string; text: string; decimals: number };

/** A number as shown, with what is needed to show it with more digits. */
type Shown = { text: string; exact: number; decimals: number; fixed: boolean };

/** a vs b in SI, equal within the load engine's own tolerance for floating-point noise. */
export function compareSI(a: number, b: number): Relation {
  if (Math.abs(a - b) <= LIMIT_EQUAL_TOLERANCE * Math.max(Math.abs(a), Math.abs(b))) return 'equal';
  return a < b ? 'below' : 'above';
}

/**
 * The typed text as it is stored: trimmed, a decimal comma read as a point, a leading "+" dropped and
 * a bare leading point given its zero (".5" → "0.5"). Null when it is not a plain decimal number.
 */
export function normaliseEntered(text: string): string | null {
  let t = text.trim().replace(',', '.');
  if (t.startsWith('+')) t = t.slice(1);
  if (!/^-?(\d+(\.\d*)?|\.\d+)$/.test(t)) return null;
  return t.replace(/^(-?)\./, '$10.');
}

function decimalsOf(text: string): number {
  const point = text.indexOf('.');
  return point < 0 ? 0 : text.length - point - 1;
}

/** toFixed without "-0" and within toFixed's range. */
function fixed(x: number, decimals: number): string {
  const text = x.toFixed(Math.min(Math.max(decimals, 0), 100));
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

function shownAt(exact: number, decimals: number): Shown {
  return { text: fixed(exact, decimals), exact, decimals, fixed: false };
}

/** A design value (a limit, a nominal size) as stated: its shortest exact form, else four figures. */
function stated(exact: number): Shown {
  const text = formatTyped(exact);
  return { text, exact, decimals: decimalsOf(text), fixed: false };
}

function computed(exact: number, sig = COMPUTED_SIGNIFICANT_FIGURES): Shown {
  const text = formatSignificant(exact, sig);
  return { text, exact, decimals: decimalsOf(text), fixed: false };
}

/** The unit of a kind with this label in either system (typed values keep the label they were typed in). */
export function unitOfLabel(kind: QuantityKind, label: string | null | undefined): DisplayUnit | null {
  if (!label) return null;
  for (const system of ['si', 'us'] as const)
    for (const u of displayUnits(kind, system)) if (u.label === label || u.mathjs === label) return u;
  return null;
}

function inSystem(kind: QuantityKind, system: UnitSystem, unit: DisplayUnit | null): boolean {
  return !!unit && displayUnits(kind, system).some((u) => u.label === unit.label);
}

/** The shortest decimal of x with at most `sig` significant figures that is x, or null. */
function shortestExact(x: number, sig = TYPED_MAX_SIGNIFICANT): string | null {
  if (!Number.isFinite(x)) return null;
  const candidate = String(Number(x.toPrecision(sig)));
  if (/e/i.test(candidate)) return null;
  // Equal up to the noise of one conversion to SI and back.
  return Math.abs(Number(candidate) - x) <= 1e-9 * Math.max(1, Math.abs(x)) ? candidate : null;
}

/**
 * A stored value of an older record, in the unit it was typed in, without its typed text: its shortest
 * exact form ("0.4", never "0.4000"), or four significant figures when it was evidently not typed.
 */
export function formatTyped(x: number): string {
  return shortestExact(x) ?? formatSignificant(x, COMPUTED_SIGNIFICANT_FIGURES);
}

/** What the inspector typed, in the unit typed: the stored text, or the recovered text of an old record. */
function typedText(valueSI: number, kind: QuantityKind, unit: DisplayUnit, entered?: string | null) {
  const inUnit = fromSI(valueSI, kind, unit.mathjs);
  const text = entered ? normaliseEntered(entered) : null;
  // A text that does not say the stored value is not shown: the value is what was analysed.
  if (text !== null && Math.abs(Number(text) - inUnit) <= 1e-9 * Math.max(1, Math.abs(inUnit))) return text;
  return shortestExact(inUnit);
}

/** The displayed number of a measured value in a display unit, by the rule in this file's header. */
function measuredShown(valueSI: number, kind: QuantityKind, display: DisplayUnit, source?: MeasuredSource) {
  const exact = fromSI(valueSI, kind, display.mathjs);
  const typedUnit = unitOfLabel(kind, source?.unit) ?? (source?.recover ? display : null);
  const typed =
    typedUnit && !(source?.spreadSI && !source.entered)
      ? typedText(valueSI, kind, typedUnit, source?.entered)
      : null;
  if (typed !== null && typedUnit) {
    if (typedUnit.label === display.label)
      return { text: typed, exact: Number(typed), decimals: decimalsOf(typed), fixed: true };
    return shownAt(exact, carriedDecimals(decimalsOf(typed), typedUnit.mathjs, display.mathjs));
  }
  const spread = source?.spreadSI ? fromSI(source.spreadSI, kind, display.mathjs) : 0;
  if (spread > 0 && Number.isFinite(spread)) return shownAt(exact, spreadDecimals(spread));
  return computed(exact);
}

/**
 * Decimals in `to` for a value typed with `decimals` decimals in `from`: the typed resolution converted,
 * then the largest power of ten not larger than it.
 */
export function carriedDecimals(decimals: number, from: string, to: string): number {
  const step = 10 ** -decimals * Math.abs(conversionFactor(from, to));
  // The small allowance keeps an exact power of ten (0.01) from becoming one decimal more.
  return Math.min(MAX_DECIMALS, Math.max(0, Math.ceil(-Math.log10(step) - 1e-9)));
}

/** Decimals that show a spread to two significant figures. */
function spreadDecimals(spread: number): number {
  return Math.min(MAX_DECIMALS, Math.max(0, 1 - Math.floor(Math.log10(spread))));
}

const joinUnit = (value: string, unit: string) => (unit === '°' ? `${value}${unit}` : `${value} ${unit}`);

function displayFor(kind: QuantityKind, system: UnitSystem, magnitudeSI: number, source?: MeasuredSource) {
  const typedUnit = unitOfLabel(kind, source?.unit);
  return typedUnit && inSystem(kind, system, typedUnit)
    ? typedUnit
    : pickDisplayUnit(magnitudeSI, kind, system);
}

/**
 * A measured or computed value with its unit. Without a source it is a computed value; with one, the
 * typed text is echoed (or its precision carried into the other system's unit).
 */
export function formatMeasured(
  valueSI: number,
  kind: QuantityKind,
  system: UnitSystem,
  source?: MeasuredSource,
  options: { unit?: string } = {},
): MeasuredText {
  if (!Number.isFinite(valueSI)) {
    const value = formatSignificant(valueSI);
    return { value, unit: '', text: value, decimals: 0 };
  }
  const unit =
    (options.unit ? unitOfLabel(kind, options.unit) : null) ?? displayFor(kind, system, valueSI, source);
  const shown = measuredShown(valueSI, kind, unit, source);
  return {
    value: shown.text,
    unit: unit.label,
    text: joinUnit(shown.text, unit.label),
    decimals: shown.decimals,
  };
}

/**
 * A design value (limit, nominal size) with its unit, as stated in the design data: "0.5 mm", "139 mm",
 * "210 kN" rather than "0.5000 mm"; converted to the other unit system, four significant figures.
 */
export function formatStated(valueSI: number, kind: QuantityKind, system: UnitSystem): MeasuredText {
  const unit = pickDisplayUnit(valueSI, kind, system);
  const shown = stated(fromSI(valueSI, kind, unit.mathjs));
  return {
    value: shown.text,
    unit: unit.label,
    text: joinUnit(shown.text, unit.label),
    decimals: shown.decimals,
  };
}

/** A spread ("± 0.023 s") to two significant figures, in the unit its value is shown in. */
export function formatSpreadOf(spreadSI: number, kind: QuantityKind, system: UnitSystem, unit?: string) {
  const display = (unit ? unitOfLabel(kind, unit) : null) ?? pickDisplayUnit(spreadSI, kind, system);
  const s = fromSI(spreadSI, kind, display.mathjs);
  const text = s > 0 && Number.isFinite(s) ? fixed(s, spreadDecimals(s)) : formatSignificant(s);
  return `± ${joinUnit(text, display.label)}`;
}

// ——— against a limit ———

type Bound = { side: 'min' | 'max'; si: number };

function boundsOf(limit: Limit): Bound[] {
  switch (limit.kind) {
    case 'upper':
      return [{ side: 'max', si: limit.max }];
    case 'lower':
      return [{ side: 'min', si: limit.min }];
    case 'range':
      return [
        ...(limit.min !== undefined ? [{ side: 'min' as const, si: limit.min }] : []),
        ...(limit.max !== undefined ? [{ side: 'max' as const, si: limit.max }] : []),
      ];
  }
}

const numericRelation = (a: number, b: number): Relation => (a === b ? 'equal' : a < b ? 'below' : 'above');

/**
 * The shown comparison is the true one, and the shown margin is not more than half again or less than
 * half the true margin (139.05 against 139.0 is not shown as 139.1, which doubles the margin).
 */
function faithful(v: Shown, b: Shown, truth: Relation): boolean {
  if (numericRelation(Number(v.text), Number(b.text)) !== truth) return false;
  if (truth === 'equal') return true;
  const gap = v.exact - b.exact;
  return Math.abs(Number(v.text) - Number(b.text) - gap) <= 0.5 * Math.abs(gap);
}

function more(s: Shown): Shown {
  return s.fixed || s.decimals >= MAX_DECIMALS ? s : shownAt(s.exact, s.decimals + 1);
}

/**
 * Adds digits to the value and the bounds until every shown comparison is the true one. `truth[i]` is
 * the value's relation to bound i, decided before rounding.
 */
function untilVisible(value: Shown, bounds: Shown[], truth: Relation[]): { value: Shown; bounds: Shown[] } {
  let v = value;
  let b = bounds;
  // A computed value equal to its limit is shown as the limit is, so equal reads as equal.
  const equalAt = truth.indexOf('equal');
  for (let step = 0; step <= 2 * MAX_DECIMALS; step++) {
    if (equalAt >= 0 && !v.fixed) {
      const d = Math.max(v.decimals, b[equalAt].decimals);
      b = b.map((x, i) => (i === equalAt ? shownAt(x.exact, d) : x));
      v = { ...b[equalAt], exact: v.exact };
    }
    const wrong = truth.findIndex((t, i) => !faithful(v, b[i], t));
    if (wrong < 0) break;
    const bound = b[wrong];
    // The limit takes digits first, unless it is already shown exactly (more digits would only be
    // zeros); a computed value takes them when the limit cannot.
    const complete = Number(bound.text) === bound.exact;
    if (!complete && (v.fixed || bound.decimals <= v.decimals) && bound.decimals < MAX_DECIMALS)
      b = b.map((x, i) => (i === wrong ? more(x) : x));
    else if (!v.fixed && v.decimals < MAX_DECIMALS) v = more(v);
    else break;
  }
  return { value: v, bounds: b };
}

export type AgainstLimit = {
  /** The value with its unit; "(at the limit)" added when it equals a bound. */
  value: string;
  /** The limit as a condition on the value: "≥ 139.0 mm", "≤ 210.0 kN", "-1.500 g to 6.000 g". */
  limit: string;
  /** The value's relation to each bound of the limit, decided before rounding. */
  relations: { side: 'min' | 'max'; relation: Relation }[];
  atLimit: boolean;
  unit: string;
};

/**
 * A value and its limit, shown in the same unit, with enough digits that the comparison the reader
 * sees is the true one.
 */
export function formatAgainstLimit(
  valueSI: number,
  limit: Limit,
  kind: QuantityKind,
  system: UnitSystem,
  source?: MeasuredSource,
): AgainstLimit {
  const bounds = boundsOf(limit);
  const largest = Math.max(Math.abs(valueSI), ...bounds.map((b) => Math.abs(b.si)));
  const unit = displayFor(kind, system, Number.isFinite(largest) ? largest : valueSI, source);
  const relations = bounds.map((b) => ({ side: b.side, relation: compareSI(valueSI, b.si) }));
  const boundShown = bounds.map((b) => stated(fromSI(b.si, kind, unit.mathjs)));
  const finite = Number.isFinite(valueSI);
  const start = finite ? measuredShown(valueSI, kind, unit, source) : computed(valueSI);
  const { value, bounds: shownBounds } = finite
    ? untilVisible(
        start,
        boundShown,
        relations.map((r) => r.relation),
      )
    : { value: start, bounds: boundShown };
  const atLimit = relations.some((r) => r.relation === 'equal');
  // Past the digits worth printing (a difference of float noise from a zero bound), words say the side.
  const hidden = relations.find(
    (r, i) => numericRelation(Number(value.text), Number(shownBounds[i].text)) !== r.relation,
  );
  const words = hidden
    ? ` (just ${hidden.relation === 'below' ? 'below' : 'above'} the ${hidden.side === 'min' ? 'minimum' : 'maximum'})`
    : atLimit
      ? ' (at the limit)'
      : '';
  const f = (s: Shown) => joinUnit(s.text, unit.label);
  const text = (side: 'min' | 'max') => f(shownBounds[bounds.findIndex((b) => b.side === side)]);
  let limitText: string;
  if (bounds.length === 2) limitText = `${text('min')} to ${text('max')}`;
  else if (bounds.length === 1) limitText = `${bounds[0].side === 'max' ? '≤' : '≥'} ${text(bounds[0].side)}`;
  else limitText = 'None';
  return {
    value: `${f(value)}${words}`,
    limit: limitText,
    relations,
    atLimit,
    unit: unit.label,
  };
}

/** A limit alone ("≥ 139.0 mm"), where no value is beside it. */
export function formatLimitOnly(limit: Limit, kind: QuantityKind, system: UnitSystem): string {
  const f = (si: number) => formatStated(si, kind, system).text;
  const bounds = boundsOf(limit);
  if (bounds.length === 2) return `${f(bounds[0].si)} to ${f(bounds[1].si)}`;
  if (bounds.length === 1) return `${bounds[0].side === 'max' ? '≤' : '≥'} ${f(bounds[0].si)}`;
  return 'None';
}

/**
 * The share of a limit used, in per cent, where 100 % is at the limit: three significant figures, with
 * more digits when rounding would carry it across 100 % (99.996 % is never shown as "100 %").
 */
export function formatShareOfLimit(ratio: number | null | undefined): string {
  if (ratio === null || ratio === undefined || !Number.isFinite(ratio)) return '—';
  const truth = compareSI(ratio, 1);
  if (truth === 'equal') return '100 %';
  const full: Shown = { text: '100', exact: 100, decimals: 0, fixed: false };
  const { value } = untilVisible(computed(ratio * 100, RATIO_SIGNIFICANT_FIGURES), [full], [truth]);
  return `${value.text} %`;
}
