/** What other features may use from notices: everything else in the folder is its own. */
export { FindingStateMark } from '@/features/notices/finding-state-mark';
export { noticeHref, noticesHref, outboxHref } from '@/features/notices/hrefs';
export { noticeKeys } from '@/features/notices/keys';
export { isPastDue, noticeKindLabel, todayIso } from '@/features/notices/notice-text';
export { fetchNotice, useNoticeList } from '@/features/notices/notices-api';
export { IssuedNoticeRow, NoticeRow } from '@/features/notices/ride-notices';
export { RIDE_NOTICES_PAGE, rideNoticeKeys, useRideNotices } from '@/features/notices/ride-notices-api';
export { SeverityMark } from '@/features/notices/severity-mark';
