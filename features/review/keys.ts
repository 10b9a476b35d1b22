import { reviewRoot } from '@/features/api';
import type { CycleResolution } from '@/features/loads/cycle-resolution-schema';

/** Query keys of the review desk; every query and mutation of the feature keys through these. */
export const reviewKeys = {
  all: reviewRoot,
  queues: () => [...reviewKeys.all, 'queue'] as const,
  /** One page of the queue, keyed by its cleaned query. */
  queue: (query: Record<string, unknown>) => [...reviewKeys.queues(), query] as const,
  inspection: (id: string) => [...reviewKeys.all, 'inspection', id] as const,
  /** The server's recomputed ride cycle of an inspection, for the charts. */
  cycle: (id: string, resolution: CycleResolution = 'bounded') =>
    [...reviewKeys.inspection(id), 'cycle', resolution] as const,
  findings: (inspectionId: string) => [...reviewKeys.inspection(inspectionId), 'findings'] as const,
  trail: (inspectionId: string) => [...reviewKeys.inspection(inspectionId), 'trail'] as const,
  trends: (rideId: string) => [...reviewKeys.all, 'trends', rideId] as const,
  /** Whether supervisors may approve inspections they recorded (the inspection body's setting). */
  selfApproval: () => [...reviewKeys.all, 'self-approval'] as const,
};
