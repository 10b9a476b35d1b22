/** Links to the review desk: the queue and one inspection's review. tsc checks each against `app/`. */
import type { Href } from 'expo-router';

export const reviewQueueHref = '/review' as const satisfies Href;
export const reviewHref = (inspectionId: string) =>
  `/review/${encodeURIComponent(inspectionId)}` as const satisfies Href;
