/**
 * The caution's words, as plain strings with no React so the server (PDF notices, e-mails) and the app
 * print exactly the same text. `components/caution.tsx` re-exports them with the on-screen box.
 */

/** Short form, shown wherever computed results appear. */
export const CAUTION_SHORT =
  'Decision aid only. Computed loads are idealised (rigid bodies; no elasticity, pin-clearance impacts, wind or drive transients). They support, and never replace, the manufacturer’s instructions and limits, local codes, and the judgement of a competent inspector and a qualified engineer.';

/** Full form, for reports, notices and the sign-in page. */
export const CAUTION_FULL = `${CAUTION_SHORT} Limits come from the ride’s design documents, never from defaults, and must not be used to justify operation outside them or to stretch inspection or NDT intervals. A reading or result over its limit calls for your jurisdiction’s procedure — stop the ride, lock out and tag out — and escalation.`;
