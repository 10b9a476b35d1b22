/**
 * Pivotwatch's vocabulary, defined once: every enumeration as a const tuple (the order is meaningful where
 * a comment says so), its words, and for the states people must tell apart at a glance its mark — an icon
 * (`lib/mark-icons.ts`), a word colour and a badge colour (`lib/colors.ts` tokens). Colour is never the only
 * signal: every mark has a shape and words of its own within its enumeration.
 *
 * Pure: the zod schemas in `features/*`, the database's enum columns (`db/server`), the app's marks, the
 * e-mails and the PDFs all read these tables; nothing else may spell these words or pick these colours.
 */
import type { ColorToken } from '@/lib/colors';
import type { MarkIconName } from '@/lib/mark-icons';

/**
 * How a state is drawn: `icon` in the `fg` colour on a badge of `bg`, with the words in `fg`. A `solid`
 * mark is white on its colour (the badge is the signal); on paper, where there is no badge, it is drawn
 * the other way round (`paperMark`).
 */
export type Mark = { icon: MarkIconName; fg: ColorToken; bg: ColorToken; solid?: true };

type Words = { label: string };
type Marked = Words & { mark: Mark };

/** The labels of a table, as `Record<value, label>`. */
export function labelsOf<K extends string>(table: Record<K, Words>): Record<K, string> {
  return Object.fromEntries(Object.entries<Words>(table).map(([k, v]) => [k, v.label])) as Record<K, string>;
}

/** A mark's word and shape colours where it stands on plain paper (PDF, e-mail) rather than on its badge. */
export const paperMark = (m: Mark): Mark => (m.solid ? { icon: m.icon, fg: m.bg, bg: m.fg } : m);

const withinMark: Mark = { icon: 'disc', fg: 'within', bg: 'withinSoft' };
const nearMark: Mark = { icon: 'triangle', fg: 'near', bg: 'nearSoft' };
const overMark: Mark = { icon: 'barred', fg: 'over', bg: 'overSoft' };

// ——— people ———

/** The four roles. Names are used in the API, the UI and the database. */
export const roles = ['inspector', 'supervisor', 'operator', 'admin'] as const;
type Role = (typeof roles)[number];
export const roleVocabulary: Record<Role, Words> = {
  inspector: { label: 'Inspector' },
  supervisor: { label: 'Supervisor' },
  operator: { label: 'Operator' },
  admin: { label: 'Administrator' },
};

/** Where an account stands: signing in, waiting for its invitation to be taken up, or turned off. */
export const accountStates = ['active', 'invited', 'disabled'] as const;
export type AccountState = (typeof accountStates)[number];
export const accountStateVocabulary: Record<AccountState, Words & { description: string }> = {
  active: { label: 'Active', description: 'Can sign in.' },
  invited: { label: 'Invited', description: 'Has not yet chosen a password from the invitation.' },
  disabled: { label: 'Disabled', description: 'Cannot sign in until an administrator enables the account.' },
};

/** The inspection body (one, the issuer of notices) and the ride operators it inspects for. */
export const companyKinds = ['inspection_body', 'operator'] as const;
export type CompanyKind = (typeof companyKinds)[number];

// ——— rides and sites ———

export const rideClasses = ['pendulum_swing', 'rotating_arm', 'wheel', 'swing_carousel', 'other'] as const;
export type RideClass = (typeof rideClasses)[number];
export const rideClassVocabulary: Record<RideClass, Words> = {
  pendulum_swing: { label: 'Pendulum swing' },
  rotating_arm: { label: 'Rotating arm' },
  wheel: { label: 'Wheel' },
  swing_carousel: { label: 'Swing carousel' },
  other: { label: 'Other rotating ride' },
};

/** Ride operating status, least restrictive first. Same shapes and colours as the envelope statuses. */
export const rideStatuses = ['in_service', 'restricted', 'out_of_service'] as const;
export type RideStatus = (typeof rideStatuses)[number];
export const rideStatusVocabulary: Record<RideStatus, Marked> = {
  in_service: { label: 'In service', mark: withinMark },
  restricted: { label: 'Restricted', mark: nearMark },
  out_of_service: { label: 'Out of service', mark: overMark },
};

export const siteKinds = ['park', 'fairground', 'travelling_setup'] as const;
export type SiteKind = (typeof siteKinds)[number];
export const siteKindVocabulary: Record<SiteKind, Words> = {
  park: { label: 'Park' },
  fairground: { label: 'Fairground' },
  travelling_setup: { label: 'Travelling set-up' },
};

// ——— maker bulletins ———

/** How much a maker's bulletin matters, in our own plain words (most pressing first). */
export const bulletinSeverities = ['stop_ride', 'safety', 'advice'] as const;
export type BulletinSeverity = (typeof bulletinSeverities)[number];
export const bulletinSeverityVocabulary: Record<BulletinSeverity, Words> = {
  stop_ride: { label: 'Ride must not run until done' },
  safety: { label: 'Safety action' },
  advice: { label: 'Maker’s advice' },
};

/**
 * Where a bulletin stands on one ride: done (an inspector or supervisor recorded it), or open, which is
 * overdue once its deadline has passed on the ride's clock, and at once for "before the next operation".
 */
export const bulletinStates = ['overdue', 'open', 'done'] as const;
export type BulletinState = (typeof bulletinStates)[number];
export const bulletinStateVocabulary: Record<BulletinState, Words> = {
  overdue: { label: 'Overdue' },
  open: { label: 'Open' },
  done: { label: 'Done' },
};

// ——— inspections ———

export const inspectionTypes = [
  'daily_pre_opening',
  'periodic',
  'annual',
  'setup_after_assembly',
  'follow_up',
  'after_repair',
] as const;
type InspectionType = (typeof inspectionTypes)[number];
export const inspectionTypeVocabulary: Record<InspectionType, Words> = {
  daily_pre_opening: { label: 'Daily pre-opening' },
  periodic: { label: 'Periodic' },
  annual: { label: 'Annual thorough' },
  setup_after_assembly: { label: 'Set-up after assembly' },
  follow_up: { label: 'Follow-up' },
  after_repair: { label: 'After repair' },
};

/** A checklist item's answer. */
export const checkResults = ['pass', 'fail', 'na'] as const;
type CheckResult = (typeof checkResults)[number];
export const checkResultVocabulary: Record<CheckResult, Words> = {
  pass: { label: 'Pass' },
  fail: { label: 'Fail' },
  na: { label: 'Not applicable' },
};

/** Where a submitted inspection stands at the review desk. */
export const reviewStates = ['submitted', 'approved', 'returned'] as const;
export type ReviewState = (typeof reviewStates)[number];
export const reviewStateVocabulary: Record<ReviewState, Words> = {
  submitted: { label: 'Awaiting decision' },
  approved: { label: 'Approved' },
  returned: { label: 'Returned to inspector' },
};

/** The image types a photo may be stored as. */
export const photoMimes = ['image/jpeg', 'image/png', 'image/webp'] as const;
export type PhotoMime = (typeof photoMimes)[number];

/** A value against its limit, best first: disc, triangle, barred square. */
export const envelopeStatuses = ['within', 'near', 'over'] as const;
export type EnvelopeStatus = (typeof envelopeStatuses)[number];
export const envelopeStatusVocabulary: Record<EnvelopeStatus, Marked> = {
  within: { label: 'Within', mark: withinMark },
  near: { label: 'Near limit', mark: nearMark },
  over: { label: 'Over limit', mark: overMark },
};

/**
 * How much a load check's warning asks of the reader (`CycleWarning.level`): `warning` (attention: the
 * record or model limits how far the result can be trusted) before `info` (a setting the engine chose or
 * a value it found, e.g. the smoothing used, a free swing's period). Shapes unlike the envelope's.
 */
export const cycleWarningLevels = ['warning', 'info'] as const;
export type CycleWarningLevel = (typeof cycleWarningLevels)[number];
export const cycleWarningLevelVocabulary: Record<CycleWarningLevel, Marked> = {
  warning: { label: 'Check this', mark: { icon: 'square-exclaim', fg: 'near', bg: 'nearSoft' } },
  info: { label: 'How it was computed', mark: { icon: 'ring', fg: 'info', bg: 'infoSoft' } },
};

// ——— the review desk ———

/**
 * An item's urgency is the first of these that applies to it; the queue sorts by this order. No two share
 * a shape; the two that mirror a load-check status keep that status's shape and colours.
 * - `incident_serious`: an operator's incident report, not yet reviewed, that stopped the ride or says
 *   someone was hurt
 * - `over`: the server's load check put a value over its limit
 * - `failed`: checklist items marked failed
 * - `near`: a value near its limit, or a pin's wear projected to reach its limit before the next inspection
 * - `incident`: any other incident report (damage, a near miss, an unplanned stop) not yet reviewed
 * - `overdue`: the ride has an inspection, or a planned NDT, past its due date
 * - `past_due`: the ride has findings still open after their due date
 * - `awaiting`: a submitted inspection with nothing flagged, waiting for sign-off
 */
export const urgencies = [
  'incident_serious',
  'over',
  'failed',
  'near',
  'incident',
  'overdue',
  'past_due',
  'awaiting',
] as const;
export type Urgency = (typeof urgencies)[number];
export const urgencyVocabulary: Record<Urgency, Marked & { description: string }> = {
  incident_serious: {
    label: 'Incident: stop or injury',
    description: 'An operator reported an incident that took the ride out of service or hurt someone.',
    // Not solid: the queue's tiles write the count in the mark's word colour.
    mark: { icon: 'octagon', fg: 'over', bg: 'overSoft' },
  },
  over: {
    label: 'Over limit',
    description: 'A computed or measured value is over its design limit.',
    mark: overMark,
  },
  failed: {
    label: 'Failed items',
    description: 'Checklist items were marked failed.',
    mark: { icon: 'crossed', fg: 'failed', bg: 'failedSoft' },
  },
  near: {
    label: 'Near limit',
    description: 'A value is near its design limit, or wear may reach its limit before the next inspection.',
    mark: nearMark,
  },
  incident: {
    label: 'Incident reported',
    description: 'An operator reported damage, a near miss or an unplanned stop, not yet reviewed.',
    mark: { icon: 'square-exclaim', fg: 'accent', bg: 'accentSoft' },
  },
  overdue: {
    label: 'Overdue',
    description: 'An inspection or a planned NDT of the ride is past its due date.',
    mark: { icon: 'clock-overdue', fg: 'overdue', bg: 'overdueSoft' },
  },
  past_due: {
    label: 'Findings past due',
    description: 'Open findings are past their due date.',
    mark: { icon: 'diamond-exclaim', fg: 'pastDue', bg: 'accentSoft' },
  },
  awaiting: {
    label: 'Awaiting sign-off',
    description: 'Submitted with nothing flagged.',
    mark: { icon: 'ring-heavy', fg: 'awaiting', bg: 'surfaceSunk' },
  },
};

/**
 * Finding severity, mildest first. The scale is ours; its words are used everywhere unchanged. The marks
 * grow heavier with it: grey ring, blue diamond, copper square with an exclamation, solid red octagon.
 */
export const findingSeverities = ['note', 'fix_by_date', 'fix_before_operation', 'stop_now'] as const;
export type FindingSeverity = (typeof findingSeverities)[number];
export const findingSeverityVocabulary: Record<
  FindingSeverity,
  Marked & { description: string; /** May the ride run while the finding is open? */ mayOperate: boolean }
> = {
  note: {
    label: 'Note',
    description: 'An observation to watch at the next inspection. No action is required.',
    mayOperate: true,
    mark: { icon: 'ring', fg: 'textMuted', bg: 'surfaceSunk' },
  },
  fix_by_date: {
    label: 'Fix by date',
    description: 'The ride may operate; the deficiency must be corrected by the due date.',
    mayOperate: true,
    mark: { icon: 'diamond', fg: 'base', bg: 'infoSoft' },
  },
  fix_before_operation: {
    label: 'Fix before operation',
    description: 'The ride must not carry riders until the deficiency is corrected and verified.',
    mayOperate: false,
    mark: { icon: 'square-exclaim', fg: 'accent', bg: 'accentSoft' },
  },
  stop_now: {
    label: 'Stop now',
    description: 'Stop the ride at once and apply lockout/tagout; escalate to a qualified engineer.',
    mayOperate: false,
    mark: { icon: 'octagon', fg: 'baseText', bg: 'over', solid: true },
  },
};

/**
 * Where a finding stands. `open` until the operator reports a corrective action (`action_reported`);
 * the supervisor or inspector then verifies and closes it, or reopens it with a comment. The shapes follow
 * the loop round: a ring with a dot, a half-filled ring, a filled disc with a tick. `documentLabel` is the
 * longer wording printed on notices, which are read without the app around them.
 */
export const findingStates = ['open', 'action_reported', 'closed'] as const;
export type FindingState = (typeof findingStates)[number];
export const findingStateVocabulary: Record<FindingState, Marked & { documentLabel: string }> = {
  open: { label: 'Open', documentLabel: 'Open', mark: { icon: 'ring-dot', fg: 'text', bg: 'surfaceSunk' } },
  action_reported: {
    label: 'Action reported',
    documentLabel: 'Corrective action reported',
    mark: { icon: 'half', fg: 'info', bg: 'infoSoft' },
  },
  closed: {
    label: 'Closed',
    documentLabel: 'Closed',
    mark: { icon: 'tick', fg: 'within', bg: 'withinSoft' },
  },
};

// ——— incidents ———

/**
 * What an operator reports about something that happened on a ride, most serious first: `harm` someone
 * hurt or something damaged, `near_miss` nothing hurt or broken but it could have been, `unplanned_stop`
 * the ride stopped when nobody meant it to (a fault, a sensor, a drive trip). Whether a person was hurt is
 * its own yes/no on the report, whatever the kind.
 */
export const incidentKinds = ['harm', 'near_miss', 'unplanned_stop'] as const;
export type IncidentKind = (typeof incidentKinds)[number];
export const incidentKindVocabulary: Record<IncidentKind, Words & { description: string }> = {
  harm: { label: 'Injury or damage', description: 'Someone was hurt, or part of the ride was damaged.' },
  near_miss: {
    label: 'Near miss',
    description: 'Nobody was hurt and nothing broke, but it could have happened.',
  },
  unplanned_stop: {
    label: 'Unplanned stop',
    description: 'The ride stopped when nobody meant it to: a fault, a sensor, a drive trip.',
  },
};

// ——— notices ———

export const noticeKinds = ['inspection', 'status_change'] as const;
export type NoticeKind = (typeof noticeKinds)[number];
export const noticeKindVocabulary: Record<NoticeKind, Words> = {
  inspection: { label: 'Inspection notice' },
  status_change: { label: 'Ride status notice' },
};

/**
 * The units an operator company's notices give their figures in, chosen per company and frozen into each
 * notice when issued: SI (kN, kN·m, mm, kg, MPa) or US customary (lbf/kip, lbf·ft/kip·ft, in, lb, ksi).
 * The same two systems as `UnitSystem` in lib/units.ts.
 */
export const noticeUnitSystems = ['si', 'us'] as const;
export type NoticeUnitSystem = (typeof noticeUnitSystems)[number];
export const noticeUnitSystemVocabulary: Record<NoticeUnitSystem, Words & { description: string }> = {
  si: { label: 'SI', description: 'kN, kN·m, mm, kg, MPa' },
  us: { label: 'US customary', description: 'lbf and kip, lbf·ft and kip·ft, in, lb, ksi' },
};

/** The paper a company's notice PDFs are laid out on, chosen per company and frozen into each notice. */
export const paperSizes = ['A4', 'LETTER'] as const;
export type PaperSizeName = (typeof paperSizes)[number];
export const paperSizeVocabulary: Record<PaperSizeName, Words & { description: string }> = {
  A4: { label: 'A4', description: '210 × 297 mm' },
  LETTER: { label: 'Letter', description: '8.5 × 11 in' },
};

/**
 * Where a notice's e-mail stands, over all its recipients: `no_address` when the operator company had no
 * notice address when it was issued (the notice exists and can be read in the app; nothing was sent),
 * `sending` while any delivery is still pending or being sent, then `sent`, `failed` or `partly_sent`.
 */
export const noticeDeliveryStates = ['no_address', 'sending', 'sent', 'partly_sent', 'failed'] as const;
export type NoticeDeliveryState = (typeof noticeDeliveryStates)[number];
export const noticeDeliveryStateVocabulary: Record<NoticeDeliveryState, Marked & { description: string }> = {
  no_address: {
    label: 'No address',
    description:
      'The operator company has no notice e-mail address, so nothing was sent. Add one in the register and send the notice again.',
    mark: { icon: 'square-dash', fg: 'textMuted', bg: 'surfaceSunk' },
  },
  sending: {
    label: 'Sending',
    description: 'The e-mail is queued or being sent; failed tries are retried.',
    mark: { icon: 'clock', fg: 'info', bg: 'infoSoft' },
  },
  sent: {
    label: 'Sent',
    description: 'The e-mail was accepted for every notice address.',
    mark: { icon: 'tick', fg: 'within', bg: 'withinSoft' },
  },
  partly_sent: {
    label: 'Partly sent',
    description: 'Some addresses received the e-mail; for others it failed after every retry.',
    mark: nearMark,
  },
  failed: {
    label: 'Not delivered',
    description: 'The e-mail failed after every retry.',
    mark: { icon: 'barred-cut', fg: 'over', bg: 'overSoft' },
  },
};

/** One e-mail to one address (a notice's delivery row). */
export const deliveryStatuses = ['pending', 'sending', 'sent', 'failed'] as const;
type DeliveryStatus = (typeof deliveryStatuses)[number];
export const deliveryStatusVocabulary: Record<DeliveryStatus, Words> = {
  pending: { label: 'Waiting to send' },
  sending: { label: 'Sending' },
  sent: { label: 'Sent' },
  failed: { label: 'Failed' },
};

/**
 * What a PDF attached to a ride's design data is (the order is the one offered in forms). The words say
 * what the paper is to the engineer reading the design, not who wrote it.
 */
export const designDocumentKinds = [
  'design_report',
  'makers_manual',
  'drawing',
  'certificate',
  'other',
] as const;
export type DesignDocumentKind = (typeof designDocumentKinds)[number];
export const designDocumentKindVocabulary: Record<DesignDocumentKind, Words & { description: string }> = {
  design_report: {
    label: 'Design report',
    description: 'The calculations and limits the design data is taken from.',
  },
  makers_manual: {
    label: 'Maker’s manual',
    description: 'Operation, maintenance and inspection instructions from the ride’s maker.',
  },
  drawing: { label: 'Drawing', description: 'A general arrangement, assembly or part drawing.' },
  certificate: {
    label: 'Certificate',
    description: 'A type examination, material or conformity certificate for the design.',
  },
  other: { label: 'Other', description: 'Any other paper that belongs with the design data.' },
};

/**
 * A travelling ride's build-up at one site: planned, built (its set-up inspection not yet approved, so it
 * may not run there), cleared to run (the set-up inspection approved), pulled down.
 */
export const setupStates = ['planned', 'set_up', 'cleared', 'pulled_down'] as const;
export type SetupState = (typeof setupStates)[number];
export const setupStateVocabulary: Record<SetupState, Words & { description: string }> = {
  planned: { label: 'Planned', description: 'Booked; the ride is not built there yet.' },
  set_up: {
    label: 'Built, awaiting set-up inspection',
    description: 'Built at the site; it may not run there until its set-up inspection is approved.',
  },
  cleared: { label: 'Cleared to run', description: 'Its set-up inspection was approved.' },
  pulled_down: { label: 'Pulled down', description: 'Taken down and moved on.' },
};

/** Every enumeration that has marks, for tests and legends that walk them all. */
export const markedVocabularies = {
  rideStatus: rideStatusVocabulary,
  envelopeStatus: envelopeStatusVocabulary,
  urgency: urgencyVocabulary,
  findingSeverity: findingSeverityVocabulary,
  findingState: findingStateVocabulary,
  noticeDeliveryState: noticeDeliveryStateVocabulary,
  cycleWarningLevel: cycleWarningLevelVocabulary,
} as const;
