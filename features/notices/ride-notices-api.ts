import { useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { noticeListResponseSchema } from '@/features/notices/schema';

/**
 * Query keys for the notices of one ride, as the review desk and the ride's page show them. They start
 * with 'notices' (the notices feature's own prefix) so that refreshing every notice query after an
 * acknowledgement, a corrective action or a close refreshes these too; `everyNotice` is that prefix.
 */
export const rideNoticeKeys = {
  everyNotice: ['notices'] as const,
  all: ['notices', 'ride'] as const,
  ride: (rideId: string) => [...rideNoticeKeys.all, rideId] as const,
};

/**
 * The most a page of notices holds (the list query's limit). A ride gets a notice per approved inspection
 * with findings and per status change, so this is years of a ride's history.
 */
export const RIDE_NOTICES_PAGE = 100;

/** While an e-mail is on its way the list is asked again this often, so "Sending" turns into the outcome. */
const SENDING_REFRESH_MS = 5000;

/** The ride's notices, newest first (`GET /api/notices?rideId=`). */
export function useRideNotices(rideId: string, enabled = true) {
  return useQuery({
    queryKey: rideNoticeKeys.ride(rideId),
    queryFn: () =>
      apiFetch(`/api/notices?rideId=${encodeURIComponent(rideId)}&pageSize=${RIDE_NOTICES_PAGE}`, {
        schema: noticeListResponseSchema,
      }),
    enabled: enabled && !!rideId,
    refetchInterval: (query) =>
      query.state.data?.notices.some((n) => n.delivery.state === 'sending') ? SENDING_REFRESH_MS : false,
  });
}
