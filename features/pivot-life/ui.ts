/** What other features may use from pivot-life that needs the app's runtime: screens' parts and hooks. */
export {
  pivotLifeKeys,
  useLogDayMutation,
  useLogImportMutation,
  useRideLifeQuery,
  useRunningLogQuery,
} from '@/features/pivot-life/api';
export { PinCheckRows } from '@/features/pivot-life/pin-check-rows';
export { WearRows } from '@/features/pivot-life/wear-rows';
export {
  LifeAssumptions,
  LifeBar,
  PivotLifeBody,
  PivotLifeSection,
  type PivotRows,
} from '@/features/pivot-life/pivot-life-section';
export { ndtKeys, useAddNdtRecordMutation, useRideNdtQuery } from '@/features/pivot-life/ndt-api';
export { NdtDueMark } from '@/features/pivot-life/ndt-due-mark';
export { NdtRows } from '@/features/pivot-life/ndt-rows';
export { NdtScreen } from '@/features/pivot-life/ndt-screen';
