/**
 * A pivot's life in words, shared by the ride page, the review desk, the notices' e-mail and their PDF, so
 * every place says the same. Pure: dates come through the caller's formatter (the app's local format, or
 * the documents' UTC one).
 */
import { powerOfTen } from '@/features/fatigue';
import type { FatigueDetailKind } from '@/features/loads/design-schema';
import { envelopeStatus, type EnvelopeStatus } from '@/features/loads/engine';
import { RATE_WINDOW_DAYS } from '@/features/pivot-life/life-math';
import type { NoticePivotLife } from '@/features/pivot-life/notice-schema';
import type { DetailLife, NdtDue, RideLife, WearTrend } from '@/features/pivot-life/schema';
import { formatShareOfLimit } from '@/lib/measured-format';
import { formatSignificant } from '@/lib/units';

type DateText = (isoDay: string) => string;

export const FATIGUE_KIND_WORDS: Record<FatigueDetailKind, string> = {
  pin_shear: 'pin in shear',
  lug_net_section: 'lug net section',
  weld_toe: 'weld toe',
  bolt: 'bolt',
  other: 'detail',
};

export const LOAD_CASE_WORDS = {
  operating: 'operating cycle',
  service_stop: 'service stop',
  emergency_stop: 'emergency stop',
} as const;

/** The standards behind each part, named wherever the life is shown. */
export const LIFE_STANDARDS = {
  fatigue:
    'Fatigue: rainflow cycle counting per ASTM E1049-85 (§5.4.4), S-N curves and the Palmgren–Miner sum per EN 1993-1-9 (§7).',
  wear: 'Wear: least-squares trend of the measured pin diameter and clearance with a 95 % prediction interval.',
  pin: 'Pin checks: EN 1993-1-8 §3.13, Table 3.10 (shear, bearing, bending, combined).',
  ndt: 'NDT: methods (EN ISO 9712 abbreviations) and intervals from the maker’s manual, in the design data.',
} as const;

/** What the projection takes for granted, in words (the arithmetic is in life-math.ts). */
export const LIFE_ASSUMPTIONS: readonly string[] = [
  'Every logged ride cycle is taken to do the damage of one ride cycle of the basis analysis: that analysis’s rate is applied to the whole log, the past included.',
  'A logged hour counts as 3600 ÷ the design’s ride cycle time ride cycles; a day giving both counts its cycles.',
  'Damage adds up linearly (Palmgren–Miner); the limit is the Miner sum the design data accepts (1.0 unless stated).',
  `The projected date assumes the ride keeps running at its rate over the last ${RATE_WINDOW_DAYS} days of the log (days without an entry count as days not run).`,
  'Loads are the computed, idealised loads of the load check; a change of programme, load or condition changes the rate.',
];

/** The life used as an envelope status, so it carries the same shape and word as any other limit. */
export const lifeStatus = (lifeUsed: number): EnvelopeStatus => envelopeStatus(lifeUsed);

export const lifeUsedText = (lifeUsed: number) => formatShareOfLimit(lifeUsed);

/** A small computed number to three significant figures: 3.20 × 10⁻⁷; ordinary sizes plainly. */
export function smallNumberText(x: number): string {
  if (x === 0 || !Number.isFinite(x)) return formatSignificant(x, 3);
  if (Math.abs(x) >= 0.01 && Math.abs(x) < 1e6) return formatSignificant(x, 3);
  const [mantissa, exponent] = x.toExponential(2).split('e');
  return `${mantissa} × ${powerOfTen(Number(exponent))}`;
}

/** Ride cycles as a count people read: whole numbers, with thin groups. */
export function cyclesText(n: number): string {
  return Math.round(n).toLocaleString('en-GB');
}

/** The projected limit date, or why there is none. */
export function projectedText(d: DetailLife, life: Pick<RideLife, 'log'>, date: DateText): string {
  if (d.projectedLimitOn !== null)
    return d.lifeUsed >= 1 ? `limit reached (${date(d.projectedLimitOn)})` : date(d.projectedLimitOn);
  if (!(d.damagePerRideCycle > 0)) return 'no damage at these stress ranges';
  if (life.log.cyclesPerDay === null) return 'no running log to project from';
  if (!(life.log.cyclesPerDay > 0)) return 'not running lately';
  return 'more than 100 years away';
}

/** "Life used 31.9 % of a limit of 1 · limit on 21 Mar 2027" for one detail. */
export function detailLine(d: DetailLife, life: Pick<RideLife, 'log'>, date: DateText): string {
  const projected =
    d.projectedLimitOn !== null
      ? `projected limit ${projectedText(d, life, date)}`
      : `no projected limit (${projectedText(d, life, date)})`;
  return `${d.name}: life used ${lifeUsedText(d.lifeUsed)} · ${projected}`;
}

/** Where the damage per ride cycle comes from. */
export function basisText(basis: RideLife['basis'], date: DateText): string {
  const version = basis.designVersion !== null ? ` (design data version ${basis.designVersion})` : '';
  if (basis.source === 'inspection')
    return `Damage per ride cycle from the inspection submitted ${basis.submittedAt ? date(basis.submittedAt.slice(0, 10)) : ''}${version}.`;
  if (basis.source === 'design')
    return `Damage per ride cycle from the design motion${version}: no analysed inspection has stored fatigue yet.`;
  return 'The design data gives no fatigue details, so no fatigue life is worked out.';
}

/** The running log's coverage and rate. */
export function logText(life: Pick<RideLife, 'log' | 'basis'>, date: DateText): string {
  const { log, basis } = life;
  if (log.entries === 0) return 'No running log yet: nothing is accumulated and no date is projected.';
  const span =
    log.firstDay && log.lastDay
      ? log.firstDay === log.lastDay
        ? date(log.firstDay)
        : `${date(log.firstDay)} to ${date(log.lastDay)}`
      : '';
  const rate =
    log.cyclesPerDay !== null
      ? `; ${formatSignificant(log.cyclesPerDay, 3)} ride cycles a day over the last ${RATE_WINDOW_DAYS} days of the log`
      : '';
  const cycle = basis.rideCycleS !== null ? ` (ride cycle ${formatSignificant(basis.rideCycleS, 3)} s)` : '';
  return `Running log: ${log.entries} ${log.entries === 1 ? 'day' : 'days'}, ${span}, ${cyclesText(log.cyclesLogged)} ride cycles${cycle}${rate}.`;
}

const NDT_STATE_WORDS: Record<NdtDue['state'], string> = {
  overdue: 'overdue',
  due: 'due soon',
  upcoming: 'upcoming',
  never_tested: 'never tested',
};

/** An NDT method's due date in words: "MT every 365 days: due 1 May 2026 (overdue)". */
export function ndtLine(d: NdtDue, date: DateText): string {
  const due = d.dueOn ? `due ${date(d.dueOn)}` : 'no due date';
  const last = d.lastOn ? `; last tested ${date(d.lastOn)}` : '';
  return `NDT ${d.method} every ${d.intervalDays} days: ${due} (${NDT_STATE_WORDS[d.state]})${last}`;
}

const WEAR_WORDS: Record<WearTrend['quantity'], string> = {
  pin_diameter: 'Pin diameter',
  clearance: 'Bushing clearance',
};

/** A flagged wear projection in words; null for one not flagged. */
export function wearFlagLine(t: WearTrend, date: DateText): string | null {
  if (!t.flagged) return null;
  const when = t.earliestOn ?? t.projectedOn;
  return (
    `${WEAR_WORDS[t.quantity]}: the wear limit may be reached by ${when ? date(when) : 'an unknown date'}` +
    `${t.projectedOn && t.projectedOn !== when ? ` (trend ${date(t.projectedOn)})` : ''}` +
    `${t.nextInspectionOn ? `, before the next inspection on ${date(t.nextInspectionOn)}` : ''}` +
    `${t.suggestedOn ? `; inspect by ${date(t.suggestedOn)}` : ''}`
  );
}

/**
 * The life as a notice carries it; null when there is nothing to say (no fatigue details, no NDT plans,
 * no flagged wear on any pivot).
 */
export function lifeNoticePart(life: RideLife, date: DateText): NoticePivotLife | null {
  const pivots = life.pivots
    .map((p) => ({
      name: p.name,
      lines: [
        ...p.details.map((d) => detailLine(d, life, date)),
        ...p.ndt.map((d) => ndtLine(d, date)),
        ...p.wear.map((t) => wearFlagLine(t, date)).filter((l): l is string => l !== null),
      ],
    }))
    .filter((p) => p.lines.length > 0);
  if (pivots.length === 0) return null;
  return {
    asOf: life.asOf,
    basis: basisText(life.basis, date),
    log: logText(life, date),
    pivots,
    assumptions: [...LIFE_ASSUMPTIONS],
    standards: Object.values(LIFE_STANDARDS),
  };
}
