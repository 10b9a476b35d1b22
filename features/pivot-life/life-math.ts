/**
 * The arithmetic of a pivot's fatigue life from the running log, pure so the server, the app and the tests
 * share it. Assumptions, stated where the life is shown:
 * - a logged hour is 3600 / rideCycleS ride cycles (the design's ride cycle time); a day giving both cycles
 *   and hours counts its cycles, which were counted rather than estimated;
 * - every logged ride cycle did the damage of one ride cycle of the basis analysis (the latest analysed
 *   inspection, else the design motion): that analysis's rate is applied to the whole log, the past included;
 * - damage adds up linearly (Palmgren–Miner, EN 1993-1-9 §A.5), so the limit is reached when the sum
 *   reaches the design's damage limit;
 * - the ride goes on running at its recent rate: ride cycles per calendar day over the last 90 days of the
 *   log (days without an entry in that window count as days not run).
 */
import { addDays, daysBetween } from '@/lib/dates';

export type LogDay = { day: string; cycles?: number | null; hours?: number | null };

/** The window the running rate is taken over, in calendar days. */
export const RATE_WINDOW_DAYS = 90;
/** Beyond this a projected date says nothing useful (and would run past the calendar). */
export const PROJECTION_HORIZON_DAYS = 100 * 365;

/** Ride cycles of one logged day; null when it gives only hours and there is no ride cycle time. */
export function rideCyclesOfDay(d: LogDay, rideCycleS: number | null): number | null {
  if (d.cycles !== null && d.cycles !== undefined) return d.cycles;
  if (d.hours !== null && d.hours !== undefined && rideCycleS !== null && rideCycleS > 0)
    return (d.hours * 3600) / rideCycleS;
  return null;
}

export type LogSummary = {
  entries: number;
  firstDay: string | null;
  lastDay: string | null;
  /** Ride cycles over the whole log (hours converted); days that cannot be converted count 0. */
  cyclesLogged: number;
  /** Days giving only hours with no ride cycle time to convert them. */
  unconverted: number;
  /** Ride cycles per calendar day over the last RATE_WINDOW_DAYS of the log; null for an empty log. */
  cyclesPerDay: number | null;
  /** The days the rate was taken over. */
  rateFrom: string | null;
  rateDays: number;
};

/**
 * The log's totals and its running rate: the window is the 90 calendar days ending on the log's last day
 * (fewer when the log is younger), and the rate is the ride cycles logged in it over its length in days.
 */
export function summariseLog(days: readonly LogDay[], rideCycleS: number | null): LogSummary {
  if (days.length === 0)
    return {
      entries: 0,
      firstDay: null,
      lastDay: null,
      cyclesLogged: 0,
      unconverted: 0,
      cyclesPerDay: null,
      rateFrom: null,
      rateDays: 0,
    };
  let firstDay = days[0].day;
  let lastDay = days[0].day;
  for (const d of days) {
    if (d.day < firstDay) firstDay = d.day;
    if (d.day > lastDay) lastDay = d.day;
  }
  const windowStart = addDays(lastDay, -(RATE_WINDOW_DAYS - 1));
  const rateFrom = windowStart > firstDay ? windowStart : firstDay;
  const rateDays = daysBetween(rateFrom, lastDay) + 1;
  let cyclesLogged = 0;
  let inWindow = 0;
  let unconverted = 0;
  for (const d of days) {
    const n = rideCyclesOfDay(d, rideCycleS);
    if (n === null) {
      unconverted++;
      continue;
    }
    cyclesLogged += n;
    if (d.day >= rateFrom) inWindow += n;
  }
  return {
    entries: days.length,
    firstDay,
    lastDay,
    cyclesLogged,
    unconverted,
    cyclesPerDay: inWindow / rateDays,
    rateFrom,
    rateDays,
  };
}

export type DetailAccumulation = {
  damage: number;
  lifeUsed: number;
  /** Null without a running rate or without damage per ride cycle, or beyond the projection horizon. */
  projectedLimitOn: string | null;
};

/**
 * A detail's damage from the log and the date its limit is reached at the recent rate:
 * damage = cycles logged × damage per ride cycle; days left = (limit − damage) / (rate × damage per ride
 * cycle), rounded down (the earlier day); a limit already reached is projected on `today`.
 */
export function accumulateDetail(
  damagePerRideCycle: number,
  damageLimit: number,
  cyclesLogged: number,
  cyclesPerDay: number | null,
  today: string,
): DetailAccumulation {
  const damage = cyclesLogged * damagePerRideCycle;
  const lifeUsed = damageLimit > 0 ? damage / damageLimit : 0;
  const perDay = cyclesPerDay !== null ? cyclesPerDay * damagePerRideCycle : 0;
  if (!(perDay > 0)) return { damage, lifeUsed, projectedLimitOn: null };
  const daysLeft = Math.max(0, Math.floor((damageLimit - damage) / perDay));
  return {
    damage,
    lifeUsed,
    projectedLimitOn: daysLeft > PROJECTION_HORIZON_DAYS ? null : addDays(today, daysLeft),
  };
}
