/** What other features and the server may use from pivot-life: runs anywhere (no React Native). */
export {
  dayProblem,
  parseRunningLogCsv,
  runningLogToCsv,
  RUNNING_LOG_CSV_COLUMNS,
  type RunningLogCsvResult,
  type RunningLogIssue,
} from '@/features/pivot-life/running-log-csv';
export {
  earliestNdtDue,
  isNdtOverdue,
  ndtDue,
  ndtDueState,
  NDT_DUE_WINDOW_DAYS,
  type NdtTest,
  type PlanFrom,
} from '@/features/pivot-life/ndt-due';
