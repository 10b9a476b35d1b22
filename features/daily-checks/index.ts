/** What runs anywhere: the contract and the missed-day rule. */
export {
  DAILY_CHECK_TYPE,
  MISSED_WINDOW_DAYS,
  dailyCheckSummarySchema,
  missedDays,
  type DailyCheckSummary,
} from '@/features/daily-checks/schema';
