/** Notices to operators: the list and one notice. */
export { NoticeListScreen } from '@/features/notices/notice-list-screen';
export { NoticeScreen } from '@/features/notices/notice-screen';
