/** What other features may render or hook into from registry (needs the app's runtime). */
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
export {
  DesignDrawingPanel,
  DesignVersionCard,
  Field,
  useDesignAnalysis,
} from '@/features/registry/design-view';
export { DeleteAction } from '@/features/registry/delete-action';
export { DueMark, dueInWords } from '@/features/registry/due-mark';
export { PlateSheetDownload } from '@/features/registry/plate-sheet-download';
export { readPickedFile } from '@/features/registry/read-picked-file';
export { RegisterTabs } from '@/features/registry/register-tabs';
export { RemovalNotice } from '@/features/registry/removal-notice';
export { RideNotFound, canEditRides, useRideIdParam } from '@/features/registry/ride-route';
