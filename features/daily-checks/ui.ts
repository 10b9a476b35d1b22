/** What other features may render from daily checks (needs the app's runtime). */
export { DailyOverviewCard, RideDailyChecksCard } from '@/features/daily-checks/daily-check-cards';
