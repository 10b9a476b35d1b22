import type { RideStatus } from '@/components/status-mark';
import { type ListedFinding } from '@/features/review/decision-api';
import { severityInfo } from '@/features/notices/finding-schema';

/**
 * What stands against approving while the ride would run: findings that forbid operation need it out of
 * service, values over their limits at least restricted (the server refuses otherwise); values near their
 * limits are worth a second look but may be approved.
 */
export function approvalConcerns<E extends { label: string; status: 'within' | 'near' | 'over' }>(
  findings: readonly Pick<ListedFinding, 'number' | 'severity' | 'state'>[],
  envelope: readonly E[],
) {
  return {
    blocking: findings.filter((f) => f.state !== 'closed' && !severityInfo[f.severity].mayOperate),
    over: envelope.filter((e) => e.status === 'over'),
    near: envelope.filter((e) => e.status === 'near'),
  };
}

/**
 * The warning an approval needs first, if any: hard when the ride would carry riders on this result (set it
 * out of service, or return the inspection), soft for values near their limits (the supervisor may confirm).
 */
export function approvalWarning(
  concerns: ReturnType<typeof approvalConcerns>,
  after: RideStatus,
  confirmed: boolean,
): 'hard' | 'soft' | null {
  const hard =
    (concerns.blocking.length > 0 && after !== 'out_of_service') ||
    (concerns.over.length > 0 && after === 'in_service');
  if (hard) return 'hard';
  if (concerns.near.length > 0 && after === 'in_service' && !confirmed) return 'soft';
  return null;
}
