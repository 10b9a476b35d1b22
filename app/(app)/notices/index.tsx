export { NoticeListScreen as default } from '@/features/notices/notice-list-screen';
