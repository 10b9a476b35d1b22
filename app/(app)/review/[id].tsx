export { InspectionReviewScreen as default } from '@/features/shell/lazy-screens';
