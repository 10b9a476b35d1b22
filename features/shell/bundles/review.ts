/** The review desk: the queue and one inspection's review. */
export { InspectionReviewScreen } from '@/features/review/inspection-screen';
export { QueueScreen } from '@/features/review/queue-screen';
