/** What other features and the server may use from notices: runs anywhere (no React Native). */
export { noticeHref, noticesHref, outboxHref } from '@/features/notices/hrefs';
export { noticeKeys } from '@/features/notices/keys';
export { isPastDue, noticeKindLabel, todayIso } from '@/features/notices/notice-text';
export { RIDE_NOTICES_PAGE, rideNoticeKeys, useRideNotices } from '@/features/notices/ride-notices-api';
