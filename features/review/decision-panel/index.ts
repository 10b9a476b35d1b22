/** The supervisor's decision on one inspection: findings, approval or return, and the ride's status. */
export { approvalConcerns } from '@/features/review/decision-panel/approval-concerns';
export { DecisionPanel } from '@/features/review/decision-panel/panel';
export type { KeyIntent } from '@/features/review/decision-panel/decision-form';
