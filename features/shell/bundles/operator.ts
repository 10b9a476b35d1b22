/** The ride operator's home. */
export { OperatorHome } from '@/features/home/operator-home';
/** The operator's daily pre-opening checks on a phone. */
export { DailyCheckScreen } from '@/features/daily-checks/daily-check-screen';
