/**
 * The rules of a ride's operating status, in one table: from each status, for each event and each role,
 * whether the change is allowed, the status it leads to and what it needs. Pure (no React, no database):
 * the server runs every change of a ride's status through `checkTransition`, and the app asks the same
 * table which controls to offer, so the two can never disagree.
 *
 * The rules in words (the README states them the same way):
 * - Stopping (out of service) or restricting a ride that runs is open to supervisors and administrators,
 *   with a reason; it can be part of a decision on an inspection or a change on its own.
 * - A ride that is out of service or restricted returns to service only through (a) the approval of a
 *   follow-up inspection, when no finding that forbids operation is open and no value is over its limit,
 *   or (b) a supervisor's override, with a reason, recorded and notified to the operator. Easing an
 *   out-of-service ride to restricted is an override too.
 * - Verifying and closing a finding never changes the status. It needs the verifier's note and evidence:
 *   a photo of the corrected part, a document reference (work order, NDT or maker's report) or the
 *   operator's corrective-action report on record. Closing the last finding that forbids operation on a
 *   stopped ride books the follow-up inspection instead.
 * - Reopening a finding that forbids operation takes a running ride out of service, with the comment as
 *   the reason. Operators report corrective action; that changes no status.
 * - An operator reporting an incident on their own ride may take it out of service with the report (the
 *   incident is the reason); that asks the inspection body for the follow-up. An operator never restarts
 *   a ride: it returns to service only by (a) or (b) above.
 */
import type { Role } from '@/features/session/schema';
import { roles } from '@/features/session/schema';
import { rideStatuses } from '@/features/rides/schema';

export type RideStatus = (typeof rideStatuses)[number];

export const rideStatusEvents = [
  /** Set out of service (in a decision, or on its own). */
  'stop',
  /** Set restricted (in a decision, or on its own). */
  'restrict',
  /** The decision approving a follow-up inspection. */
  'follow_up_approved',
  /** A supervisor returns a stopped or restricted ride to service without a follow-up inspection. */
  'override',
  /** A finding verified corrected and closed. */
  'finding_closed',
  /** A finding that forbids operation opened again. */
  'blocking_finding_reopened',
  /** The operator's report of what was done about a finding. */
  'action_reported',
  /** The operator stops their own ride with an incident report. */
  'incident_stop',
  /** A travelling ride built up at a site: it may not run there before its set-up inspection is approved. */
  'setup_started',
  /** The decision approving the set-up inspection of the ride's current set-up. */
  'setup_approved',
] as const;
export type RideStatusEvent = (typeof rideStatusEvents)[number];

/**
 * What a transition needs before it may happen:
 * - `reason`: a reason the operator reads with the status
 * - `note`: the verifier's (or reporter's) comment
 * - `evidence`: a photo, a document reference, or the operator's corrective-action report
 * - `follow_up_inspection`: the approved inspection is of the follow-up type
 * - `no_open_blocking_findings`: no finding that forbids operation is open on the ride
 * - `no_over_limit_values`: the inspection has no value over its limit
 * - `override`: recorded as an override (its own audit entry and notice to the operator)
 * - `setup_inspection`: the approved inspection is of the set-up type
 * - `stopped_for_setup`: the ride's status was set by its current set-up, not by anything else
 */
export const transitionRequirements = [
  'reason',
  'note',
  'evidence',
  'follow_up_inspection',
  'no_open_blocking_findings',
  'no_over_limit_values',
  'override',
  'setup_inspection',
  'stopped_for_setup',
] as const;
type TransitionRequirement = (typeof transitionRequirements)[number];

type TransitionRule =
  | { allowed: true; to: RideStatus; requires: readonly TransitionRequirement[] }
  | { allowed: false; why: string };

const deciders: readonly Role[] = ['supervisor', 'admin'];
const verifiers: readonly Role[] = ['inspector', 'supervisor', 'admin'];

const no = (why: string): TransitionRule => ({ allowed: false, why });
const yes = (to: RideStatus, ...requires: TransitionRequirement[]): TransitionRule => ({
  allowed: true,
  to,
  requires,
});

const NOT_YOURS = {
  stop: 'Only a supervisor or an administrator sets a ride out of service.',
  restrict: 'Only a supervisor or an administrator restricts a ride.',
  follow_up_approved: 'Only a supervisor or an administrator approves inspections.',
  override: 'Only a supervisor can return a stopped or restricted ride to service without a follow-up.',
  finding_closed: 'Findings are verified and closed by the inspection body (inspector or supervisor).',
  blocking_finding_reopened: 'Findings are reopened by the inspection body (inspector or supervisor).',
  action_reported: 'Corrective action is reported by the ride’s operator.',
  incident_stop:
    'Only the ride’s operator stops it with an incident report; the inspection body uses the status change.',
  setup_started: 'Only a supervisor or an administrator plans or records a ride’s set-up.',
  setup_approved: 'Only a supervisor or an administrator approves inspections.',
} satisfies Record<RideStatusEvent, string>;

/** One cell of the table, written out case by case so each rule can be read on its own. */
function rule(from: RideStatus, event: RideStatusEvent, role: Role): TransitionRule {
  switch (event) {
    case 'stop':
      if (!deciders.includes(role)) return no(NOT_YOURS.stop);
      if (from === 'out_of_service') return no('The ride is already out of service.');
      return yes('out_of_service', 'reason');
    case 'restrict':
      if (!deciders.includes(role)) return no(NOT_YOURS.restrict);
      if (from === 'restricted') return no('The ride is already restricted.');
      if (from === 'in_service') return yes('restricted', 'reason');
      // Easing a stop is a return towards service: a supervisor's override only.
      if (role !== 'supervisor') return no(NOT_YOURS.override);
      return yes('restricted', 'reason', 'override');
    case 'follow_up_approved':
      if (!deciders.includes(role)) return no(NOT_YOURS.follow_up_approved);
      if (from === 'in_service') return yes('in_service');
      return yes('in_service', 'follow_up_inspection', 'no_open_blocking_findings', 'no_over_limit_values');
    case 'override':
      if (role !== 'supervisor') return no(NOT_YOURS.override);
      if (from === 'in_service') return no('The ride is already in service; there is nothing to override.');
      return yes('in_service', 'reason', 'override');
    case 'finding_closed':
      if (!verifiers.includes(role)) return no(NOT_YOURS.finding_closed);
      // Never a return to service: that takes the follow-up inspection (or an override).
      return yes(from, 'note', 'evidence');
    case 'blocking_finding_reopened':
      if (!verifiers.includes(role)) return no(NOT_YOURS.blocking_finding_reopened);
      return yes(from === 'in_service' ? 'out_of_service' : from, 'note');
    case 'action_reported':
      if (role !== 'operator') return no(NOT_YOURS.action_reported);
      return yes(from, 'note');
    case 'incident_stop':
      if (role !== 'operator') return no(NOT_YOURS.incident_stop);
      if (from === 'out_of_service') return no('The ride is already out of service.');
      return yes('out_of_service', 'reason');
    case 'setup_started':
      if (!deciders.includes(role)) return no(NOT_YOURS.setup_started);
      // Already stopped for something else: it stays so, and that cause still needs its own way back.
      if (from === 'out_of_service') return no('The ride is already out of service.');
      return yes('out_of_service', 'reason');
    case 'setup_approved':
      if (!deciders.includes(role)) return no(NOT_YOURS.setup_approved);
      if (from === 'in_service') return yes('in_service');
      return yes(
        'in_service',
        'setup_inspection',
        'stopped_for_setup',
        'no_open_blocking_findings',
        'no_over_limit_values',
      );
  }
}

/** The whole table: `transitionTable[from][event][role]`. */
export const transitionTable: Record<
  RideStatus,
  Record<RideStatusEvent, Record<Role, TransitionRule>>
> = Object.fromEntries(
  rideStatuses.map((from) => [
    from,
    Object.fromEntries(
      rideStatusEvents.map((event) => [
        event,
        Object.fromEntries(roles.map((role) => [role, rule(from, event, role)])),
      ]),
    ),
  ]),
) as Record<RideStatus, Record<RideStatusEvent, Record<Role, TransitionRule>>>;

/** The facts a transition's requirements are checked against; absent facts count as not given. */
export type TransitionFacts = {
  reason?: string | null;
  note?: string | null;
  /** A photo or document reference given with the change, or a corrective-action report on record. */
  evidence?: boolean;
  inspectionType?: string | null;
  openBlockingFindings?: number;
  overLimitValues?: number;
  /** True when the ride's last status change was its current set-up's start. */
  stoppedForSetup?: boolean;
};

export type TransitionProblem = {
  code: string;
  message: string;
  /** The request field the problem is about, when there is one. */
  path?: string;
};

type TransitionCheck =
  { ok: true; to: RideStatus; override: boolean } | { ok: false; problems: TransitionProblem[] };

const filled = (s: string | null | undefined) => typeof s === 'string' && s.trim() !== '';

const requirementProblem: Record<TransitionRequirement, (f: TransitionFacts) => TransitionProblem | null> = {
  reason: (f) =>
    filled(f.reason)
      ? null
      : {
          code: 'reason_required',
          path: 'reason',
          message: 'Say why; the operator reads it with the status.',
        },
  note: (f) =>
    filled(f.note) ? null : { code: 'note_required', path: 'note', message: 'Write the verifier’s note.' },
  evidence: (f) =>
    f.evidence
      ? null
      : {
          code: 'evidence_required',
          path: 'evidence',
          message:
            'Give evidence of the correction: a photo, a document reference (work order, NDT or maker’s ' +
            'report), or wait for the operator’s corrective-action report.',
        },
  follow_up_inspection: (f) =>
    f.inspectionType === 'follow_up'
      ? null
      : {
          code: 'follow_up_required',
          message: 'Only a follow-up inspection returns a stopped or restricted ride to service.',
        },
  no_open_blocking_findings: (f) =>
    (f.openBlockingFindings ?? 0) === 0
      ? null
      : {
          code: 'blocking_findings_open',
          message: `${f.openBlockingFindings} finding(s) that forbid operation are still open; verify and close them first.`,
        },
  no_over_limit_values: (f) =>
    (f.overLimitValues ?? 0) === 0
      ? null
      : {
          code: 'over_limit',
          message: `${f.overLimitValues} value(s) of the inspection are over their limits.`,
        },
  override: () => null,
  setup_inspection: (f) =>
    f.inspectionType === 'setup_after_assembly'
      ? null
      : {
          code: 'setup_inspection_required',
          message: 'Only the set-up inspection clears a ride built up at a new site.',
        },
  stopped_for_setup: (f) =>
    f.stoppedForSetup
      ? null
      : {
          code: 'stopped_for_other_cause',
          message:
            'The ride was stopped for another cause than its set-up; it returns to service by a follow-up ' +
            'inspection or an override.',
        },
};

/** Whether `role` may make `event` happen to a ride in `from`, given the facts; and to what status. */
export function checkTransition(
  from: RideStatus,
  event: RideStatusEvent,
  role: Role,
  facts: TransitionFacts = {},
): TransitionCheck {
  const r = transitionTable[from][event][role];
  if (!r.allowed) return { ok: false, problems: [{ code: 'not_allowed', message: r.why }] };
  const problems = r.requires
    .map((req) => requirementProblem[req](facts))
    .filter((p): p is TransitionProblem => p !== null);
  if (problems.length > 0) return { ok: false, problems };
  return { ok: true, to: r.to, override: r.requires.includes('override') };
}

const strictness: Record<RideStatus, number> = { in_service: 0, restricted: 1, out_of_service: 2 };

/**
 * The event a person's request to set `to` on a ride in `from` stands for, or null when it changes
 * nothing. A person asks for a status; only the system's own events (approving a follow-up, closing or
 * reopening findings) come from elsewhere.
 */
export function eventForStatus(from: RideStatus, to: RideStatus): RideStatusEvent | null {
  if (from === to) return null;
  if (to === 'out_of_service') return 'stop';
  if (to === 'restricted') return 'restrict';
  return 'override';
}

/** True when `to` lets the ride do more than `from` (a return towards service). */
export const eases = (from: RideStatus, to: RideStatus) => strictness[to] < strictness[from];

/** The statuses `role` may ask for on a ride in `from`, each with whether it is an override. */
export function statusChoices(
  from: RideStatus,
  role: Role,
): { status: RideStatus; event: RideStatusEvent; override: boolean }[] {
  return rideStatuses.flatMap((to) => {
    const event = eventForStatus(from, to);
    if (!event) return [];
    const r = transitionTable[from][event][role];
    return r.allowed ? [{ status: to, event, override: r.requires.includes('override') }] : [];
  });
}
