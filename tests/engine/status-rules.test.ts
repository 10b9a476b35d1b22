/**
 * The ride-status transition table, cell by cell. The expected table below is written out by hand from
 * the rules as the README states them (the product's own rules, not a standard: common practice in ride
 * inspection is that a ride stopped for a defect runs again only after a competent person's check), so
 * a change to any cell of `features/review/status-rules.ts` shows up here as a named difference.
 */
import { roles, type Role } from '@/features/session/schema';
import {
  checkTransition,
  eventForStatus,
  rideStatusEvents,
  statusChoices,
  transitionTable,
  type RideStatusEvent,
} from '@/features/rides/status-rules';
import { rideStatuses } from '@/features/rides/schema';

type Status = (typeof rideStatuses)[number];

/**
 * Per event and role, the outcome from in_service, restricted, out_of_service (in that order):
 * '-' refused, else `to` and `+requirement` flags.
 */
const R = '+reason';
const FU = '+follow_up_inspection+no_open_blocking_findings+no_over_limit_values';
const SU = '+setup_inspection+stopped_for_setup+no_open_blocking_findings+no_over_limit_values';
const expected: Record<RideStatusEvent, Record<Role, [string, string, string]>> = {
  stop: {
    inspector: ['-', '-', '-'],
    supervisor: [`out_of_service${R}`, `out_of_service${R}`, '-'],
    operator: ['-', '-', '-'],
    admin: [`out_of_service${R}`, `out_of_service${R}`, '-'],
  },
  restrict: {
    inspector: ['-', '-', '-'],
    supervisor: [`restricted${R}`, '-', `restricted${R}+override`],
    operator: ['-', '-', '-'],
    admin: [`restricted${R}`, '-', '-'],
  },
  follow_up_approved: {
    inspector: ['-', '-', '-'],
    supervisor: ['in_service', `in_service${FU}`, `in_service${FU}`],
    operator: ['-', '-', '-'],
    admin: ['in_service', `in_service${FU}`, `in_service${FU}`],
  },
  override: {
    inspector: ['-', '-', '-'],
    supervisor: ['-', `in_service${R}+override`, `in_service${R}+override`],
    operator: ['-', '-', '-'],
    admin: ['-', '-', '-'],
  },
  finding_closed: {
    inspector: ['in_service+note+evidence', 'restricted+note+evidence', 'out_of_service+note+evidence'],
    supervisor: ['in_service+note+evidence', 'restricted+note+evidence', 'out_of_service+note+evidence'],
    operator: ['-', '-', '-'],
    admin: ['in_service+note+evidence', 'restricted+note+evidence', 'out_of_service+note+evidence'],
  },
  blocking_finding_reopened: {
    inspector: ['out_of_service+note', 'restricted+note', 'out_of_service+note'],
    supervisor: ['out_of_service+note', 'restricted+note', 'out_of_service+note'],
    operator: ['-', '-', '-'],
    admin: ['out_of_service+note', 'restricted+note', 'out_of_service+note'],
  },
  action_reported: {
    inspector: ['-', '-', '-'],
    supervisor: ['-', '-', '-'],
    operator: ['in_service+note', 'restricted+note', 'out_of_service+note'],
    admin: ['-', '-', '-'],
  },
  incident_stop: {
    inspector: ['-', '-', '-'],
    supervisor: ['-', '-', '-'],
    operator: [`out_of_service${R}`, `out_of_service${R}`, '-'],
    admin: ['-', '-', '-'],
  },
  // A ride built up at a new site runs there only after its set-up inspection (issue #19).
  setup_started: {
    inspector: ['-', '-', '-'],
    supervisor: [`out_of_service${R}`, `out_of_service${R}`, '-'],
    operator: ['-', '-', '-'],
    admin: [`out_of_service${R}`, `out_of_service${R}`, '-'],
  },
  setup_approved: {
    inspector: ['-', '-', '-'],
    supervisor: ['in_service', `in_service${SU}`, `in_service${SU}`],
    operator: ['-', '-', '-'],
    admin: ['in_service', `in_service${SU}`, `in_service${SU}`],
  },
};

const cellText = (from: Status, event: RideStatusEvent, role: Role) => {
  const r = transitionTable[from][event][role];
  return r.allowed ? `${r.to}${r.requires.map((q) => `+${q}`).join('')}` : '-';
};

describe('the ride-status transition table', () => {
  const cells = rideStatuses.flatMap((from, i) =>
    rideStatusEvents.flatMap((event) => roles.map((role) => [from, event, role, i] as const)),
  );

  it('has every cell of from × event × role (3 × 10 × 4)', () => {
    expect(cells).toHaveLength(rideStatuses.length * rideStatusEvents.length * roles.length);
    expect(cells).toHaveLength(120);
  });

  it.each(cells)('from %s, %s by %s', (from, event, role, i) => {
    expect(cellText(from, event, role)).toBe(expected[event][role][i]);
    const r = transitionTable[from][event][role];
    if (!r.allowed) expect(r.why.length).toBeGreaterThan(10);
  });

  it('never puts a stopped or restricted ride in service except by an approved follow-up or set-up inspection, or an override', () => {
    for (const [from, event, role] of cells) {
      const r = transitionTable[from][event][role];
      if (from !== 'in_service' && r.allowed && r.to === 'in_service')
        expect(
          event === 'follow_up_approved'
            ? r.requires.includes('follow_up_inspection') && r.requires.includes('no_open_blocking_findings')
            : event === 'setup_approved'
              ? r.requires.includes('setup_inspection') &&
                r.requires.includes('stopped_for_setup') &&
                r.requires.includes('no_open_blocking_findings')
              : event === 'override' && role === 'supervisor' && r.requires.includes('reason'),
        ).toBe(true);
    }
  });

  it('an operator may stop their ride with an incident report, and never set any status that eases it', () => {
    for (const [from, event, role] of cells) {
      const r = transitionTable[from][event][role];
      if (role === 'operator' && r.allowed && r.to !== from)
        expect([event, r.to]).toEqual(['incident_stop', 'out_of_service']);
    }
  });

  it('closing a finding never changes the status', () => {
    for (const from of rideStatuses)
      for (const role of roles) {
        const r = transitionTable[from].finding_closed[role];
        if (r.allowed) expect(r.to).toBe(from);
      }
  });
});

describe('checking a transition against the facts', () => {
  it('closing needs the note and the evidence', () => {
    const c = checkTransition('out_of_service', 'finding_closed', 'inspector', {});
    expect(c.ok).toBe(false);
    if (!c.ok) expect(c.problems.map((p) => p.code)).toEqual(['note_required', 'evidence_required']);
    expect(checkTransition('out_of_service', 'finding_closed', 'inspector', { note: '  ' }).ok).toBe(false);
    expect(
      checkTransition('out_of_service', 'finding_closed', 'inspector', {
        note: 'New pin fitted',
        evidence: true,
      }),
    ).toEqual({ ok: true, to: 'out_of_service', override: false });
  });

  it('an approved follow-up returns the ride only when nothing blocks it', () => {
    const facts = { inspectionType: 'follow_up', openBlockingFindings: 0, overLimitValues: 0 };
    expect(checkTransition('out_of_service', 'follow_up_approved', 'supervisor', facts)).toEqual({
      ok: true,
      to: 'in_service',
      override: false,
    });
    for (const [change, code] of [
      [{ inspectionType: 'periodic' }, 'follow_up_required'],
      [{ openBlockingFindings: 1 }, 'blocking_findings_open'],
      [{ overLimitValues: 2 }, 'over_limit'],
    ] as const) {
      const c = checkTransition('restricted', 'follow_up_approved', 'admin', { ...facts, ...change });
      expect(c.ok).toBe(false);
      if (!c.ok) expect(c.problems.map((p) => p.code)).toEqual([code]);
    }
  });

  it('an override needs a supervisor and a reason, and says it is one', () => {
    expect(checkTransition('out_of_service', 'override', 'supervisor', { reason: '' }).ok).toBe(false);
    expect(checkTransition('out_of_service', 'override', 'admin', { reason: 'x' }).ok).toBe(false);
    expect(
      checkTransition('out_of_service', 'override', 'supervisor', { reason: 'Engineer signed off' }),
    ).toEqual({ ok: true, to: 'in_service', override: true });
  });
});

describe('what a person may ask for', () => {
  it('maps a requested status to its event', () => {
    expect(eventForStatus('in_service', 'in_service')).toBeNull();
    expect(eventForStatus('in_service', 'out_of_service')).toBe('stop');
    expect(eventForStatus('out_of_service', 'restricted')).toBe('restrict');
    expect(eventForStatus('restricted', 'in_service')).toBe('override');
  });

  it('offers each role only the changes the table allows', () => {
    expect(statusChoices('out_of_service', 'supervisor')).toEqual([
      { status: 'in_service', event: 'override', override: true },
      { status: 'restricted', event: 'restrict', override: true },
    ]);
    expect(statusChoices('out_of_service', 'admin')).toEqual([]);
    expect(statusChoices('in_service', 'admin').map((c) => c.status)).toEqual([
      'restricted',
      'out_of_service',
    ]);
    for (const from of rideStatuses) {
      expect(statusChoices(from, 'inspector')).toEqual([]);
      expect(statusChoices(from, 'operator')).toEqual([]);
    }
  });
});
