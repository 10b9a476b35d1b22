export { InspectionReviewScreen as default } from '@/features/review/inspection-screen';
