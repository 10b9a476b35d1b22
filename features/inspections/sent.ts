/**
 * The inspector's sent inspections and what the supervisors decided on them, put together on the phone
 * from the outbox, the pulled decisions, the cached rides and any correction being recorded. Pure: no
 * React, no database, so the list works offline and is easy to check.
 */
import type { OutboxState } from '@/db/device/schema';
import { type InspectionRecord, type InspectionType, inspectionTypes } from '@/features/records/schema';
import { type FindingSeverity, findingSeverities, findingStates } from '@/features/review/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import type { PulledDecision } from '@/features/sync/pull-schema';
import { findingStateVocabulary, labelsOf } from '@/lib/vocabulary';

const findingStateLabel = labelsOf(findingStateVocabulary);

export type FindingView = {
  key: string;
  number: number;
  /** Null when a newer server sent a severity this app does not know; `severityLabel` then shows it as sent. */
  severity: FindingSeverity | null;
  severityLabel: string;
  description: string;
  requiredAction: string | null;
  dueOn: string | null;
  stateLabel: string | null;
};

export type DecisionView = {
  state: 'approved' | 'returned' | 'other';
  /** The state as the server sent it (for a state this app does not know). */
  stateText: string | null;
  note: string | null;
  decidedAt: string | null;
  decidedByName: string | null;
  findings: FindingView[];
};

/** Where the record stands on its way to the server. */
export type SendState = 'waiting' | 'sent' | 'refused' | 'unknown';

export type SentInspection = {
  id: string;
  rideId: string | null;
  rideName: string;
  type: InspectionType | null;
  submittedAt: string | null;
  send: SendState;
  /** This record is itself a correction of another. */
  amends: string | null;
  decision: DecisionView | null;
  /** A correction of this inspection: still being recorded on the phone, or submitted. */
  correction: { id: string; state: 'draft' | 'submitted' } | null;
  /** Returned, and no correction has been submitted yet: the inspector has to act. */
  needsAction: boolean;
  /** The original record is on this phone, so a correction can start from it. */
  canCorrect: boolean;
};

const isOneOf = <T extends string>(values: readonly T[], v: unknown): v is T =>
  typeof v === 'string' && (values as readonly string[]).includes(v);

function toDecisionView(d: PulledDecision): DecisionView {
  const state = d.state === 'approved' || d.state === 'returned' ? d.state : 'other';
  const findings = [...(d.findings ?? [])]
    .sort((a, b) => a.number - b.number)
    .map((f, i) => {
      const severity = isOneOf(findingSeverities, f.severity) ? f.severity : null;
      return {
        key: f.id ?? `${f.number}-${i}`,
        number: f.number,
        severity,
        severityLabel: severity ? severityInfo[severity].label : f.severity,
        description: f.description,
        requiredAction: f.requiredAction ?? null,
        dueOn: f.dueOn ?? null,
        stateLabel: isOneOf(findingStates, f.state) ? findingStateLabel[f.state] : (f.state ?? null),
      };
    });
  return {
    state,
    stateText: d.state ?? null,
    note: d.note ?? null,
    decidedAt: d.decidedAt ?? null,
    decidedByName: d.decidedByName ?? null,
    findings,
  };
}

const sendOf = (state: OutboxState): SendState =>
  state === 'accepted' ? 'sent' : state === 'rejected' ? 'refused' : 'waiting';

/**
 * Every sent inspection the phone knows of, newest first, with those waiting for the inspector's
 * correction on top. A decision whose inspection is not in this phone's outbox (sent from another
 * device, or before a reinstall) is listed too, from what the decision itself says.
 */
export function buildSentList(input: {
  outbox: { id: string; state: OutboxState; record: InspectionRecord }[];
  decisions: PulledDecision[];
  rides: { id: string; name: string }[];
  /** Drafts being recorded that correct a sent inspection. */
  corrections: { id: string; amendsId: string }[];
}): SentInspection[] {
  const rideName = new Map(input.rides.map((r) => [r.id, r.name]));
  const decisionOf = new Map(input.decisions.map((d) => [d.inspectionId, d]));
  const correctionOf = new Map<string, SentInspection['correction']>();
  for (const d of input.corrections) correctionOf.set(d.amendsId, { id: d.id, state: 'draft' });
  // A submitted correction outranks one still being recorded.
  for (const o of input.outbox)
    if (o.record.amendsId) correctionOf.set(o.record.amendsId, { id: o.id, state: 'submitted' });

  const entry = (
    base: Omit<SentInspection, 'decision' | 'correction' | 'needsAction'>,
    raw: PulledDecision | undefined,
  ): SentInspection => {
    const decision = raw ? toDecisionView(raw) : null;
    const correction = correctionOf.get(base.id) ?? null;
    return {
      ...base,
      decision,
      correction,
      needsAction: decision?.state === 'returned' && correction?.state !== 'submitted',
    };
  };

  const list: SentInspection[] = input.outbox.map((o) =>
    entry(
      {
        id: o.id,
        rideId: o.record.rideId,
        rideName: rideName.get(o.record.rideId) ?? 'A ride no longer on this phone',
        type: o.record.type,
        submittedAt: o.record.submittedAt,
        send: sendOf(o.state),
        amends: o.record.amendsId ?? null,
        canCorrect: true,
      },
      decisionOf.get(o.id),
    ),
  );
  const inOutbox = new Set(input.outbox.map((o) => o.id));
  for (const d of input.decisions) {
    if (inOutbox.has(d.inspectionId)) continue;
    list.push(
      entry(
        {
          id: d.inspectionId,
          rideId: d.rideId ?? null,
          rideName: (d.rideId && rideName.get(d.rideId)) || 'A ride no longer on this phone',
          type: isOneOf(inspectionTypes, d.type) ? d.type : null,
          submittedAt: typeof d.submittedAt === 'string' ? d.submittedAt : null,
          send: 'unknown',
          amends: null,
          canCorrect: false,
        },
        d,
      ),
    );
  }
  const when = (s: SentInspection) => s.submittedAt ?? s.decision?.decidedAt ?? '';
  return list.sort((a, b) => Number(b.needsAction) - Number(a.needsAction) || when(b).localeCompare(when(a)));
}

type SentGroups = {
  /** Returned by a supervisor and not yet corrected: the inspector has to act. */
  returned: SentInspection[];
  /** Still on this phone, queued or going up: never listed as sent. */
  waiting: SentInspection[];
  /** The server refused the record: it is not sent until the inspector sends it again. */
  refused: SentInspection[];
  /** On the server (accepted, or known from a decision). */
  sent: SentInspection[];
};

/** Splits the list by where each inspection really is, keeping its order within each group. */
export function groupSent(list: readonly SentInspection[]): SentGroups {
  const groups: SentGroups = { returned: [], waiting: [], refused: [], sent: [] };
  for (const s of list) {
    if (s.needsAction) groups.returned.push(s);
    else if (s.send === 'waiting') groups.waiting.push(s);
    else if (s.send === 'refused') groups.refused.push(s);
    else groups.sent.push(s);
  }
  return groups;
}
