/** What other features may use from registry: everything else in the folder is its own. */
export {
  operatorChoices,
  registryKeys,
  useCompanyListQuery,
  useDesignVersionQuery,
  useInspectorsQuery,
  useMyAssignmentsQuery,
  useRidePageQuery,
  useRideQuery,
  useRideSchedulesQuery,
  useSiteListQuery,
} from '@/features/registry/api';
export { auditEntityLabel } from '@/features/registry/audit-screen';
export { ChainDrawing } from '@/features/registry/chain-drawing';
export type { PivotPeak } from '@/features/registry/chain-drawing';
export { designPose } from '@/features/registry/chain-geometry';
export {
  DesignDrawingPanel,
  DesignVersionCard,
  Field,
  useDesignAnalysis,
} from '@/features/registry/design-view';
export { DueMark, dueInWords } from '@/features/registry/due-mark';
export { auditHref } from '@/features/registry/hrefs';
export { RegisterTabs } from '@/features/registry/register-tabs';
export { RideNotFound, canEditRides, useRideIdParam } from '@/features/registry/ride-route';
