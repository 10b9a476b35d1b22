/** What other features may render or hook into from notices (needs the app's runtime). */
export { FindingStateMark } from '@/features/notices/finding-state-mark';
export { fetchNotice, useNoticeList } from '@/features/notices/notices-api';
export { IssuedNoticeRow, NoticeRow } from '@/features/notices/ride-notices';
export { SeverityMark } from '@/features/notices/severity-mark';
export { EvidencePhotos, problemText, useEvidencePhotos } from '@/features/notices/corrective-action-form';
export { NoticePhotos } from '@/features/notices/notice-photos';
