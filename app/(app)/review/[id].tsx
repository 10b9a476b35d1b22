import { InspectionReviewScreen } from '@/features/review/inspection-screen';

export default InspectionReviewScreen;
