/**
 * One change of a design revision (`diffDesign` lists them): what it is, and how it reads — one sentence
 * per change, and the count of limits moved.
 */

export type DesignSection =
  | 'source'
  | 'general'
  | 'bodies'
  | 'parts'
  | 'pivots'
  | 'pinChecks'
  | 'ndt'
  | 'seats'
  | 'motion'
  | 'rider'
  | 'fatigue';

/** Whether the field was given before and after: changed (both), added (only after), removed (only before). */
export type ChangeKind = 'changed' | 'added' | 'removed';

/** For limits: loosened or tightened; for design values and names: changed. */
export type ChangeEffect = 'loosened' | 'tightened' | 'changed';

export type DesignChange = {
  section: DesignSection;
  /** The pivot, body, part, seat or joint the field belongs to ("Main pivot"); '' for ride-wide fields. */
  where: string;
  /** The field in words ("Max clearance"). */
  field: string;
  /** The value with its unit, or null when it was not given. */
  before: string | null;
  after: string | null;
  kind: ChangeKind;
  effect: ChangeEffect;
  /** True for the fields a measured or computed value is checked against. */
  limit: boolean;
};

export const sectionLabel: Record<DesignSection, string> = {
  source: 'Source document',
  general: 'Whole ride',
  bodies: 'Bodies',
  parts: 'Parts',
  pivots: 'Pivots and pins',
  pinChecks: 'Pin checks (EN 1993-1-8)',
  ndt: 'NDT plans',
  seats: 'Seats',
  motion: 'Design motion and limits',
  rider: 'Rider limits',
  fatigue: 'Fatigue (EN 1993-1-9)',
};

export const effectWord: Record<ChangeEffect, string> = {
  loosened: 'loosened',
  tightened: 'tightened',
  changed: 'changed',
};

/** One change as a sentence: "Max clearance at Main pivot: 0.4 mm → 0.6 mm (loosened)". */
export function changeText(ch: DesignChange): string {
  const subject = ch.where ? `${ch.field} at ${ch.where}` : ch.field;
  const value = (v: string | null) => v ?? 'not given';
  const words =
    ch.kind === 'added'
      ? `${value(ch.after)} (added${ch.limit ? ', tightened' : ''})`
      : ch.kind === 'removed'
        ? `${value(ch.before)} removed${ch.limit ? ' (loosened: no longer checked)' : ''}`
        : `${value(ch.before)} → ${value(ch.after)}${ch.limit ? ` (${effectWord[ch.effect]})` : ''}`;
  return `${subject}: ${words}`;
}

export type DesignDiffSummary = { changes: number; loosened: number; tightened: number };

export function summarise(changes: readonly DesignChange[]): DesignDiffSummary {
  return {
    changes: changes.length,
    loosened: changes.filter((ch) => ch.effect === 'loosened').length,
    tightened: changes.filter((ch) => ch.effect === 'tightened').length,
  };
}

/** The summary in words: "7 changes: 2 limits loosened, 1 tightened". */
export function summaryText(s: DesignDiffSummary): string {
  if (s.changes === 0) return 'No change from the version in force.';
  const parts = [
    s.loosened ? `${s.loosened} limit${s.loosened === 1 ? '' : 's'} loosened` : null,
    s.tightened ? `${s.tightened} limit${s.tightened === 1 ? '' : 's'} tightened` : null,
  ].filter(Boolean);
  return `${s.changes} change${s.changes === 1 ? '' : 's'}${parts.length ? `: ${parts.join(', ')}` : ', no limit changed'}.`;
}
