/** A design revision's changes in words: one sentence per change, and the count of limits moved. */
import type { ChangeEffect, DesignChange } from '@/features/registry/design-diff';

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
