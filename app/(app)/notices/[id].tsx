export { NoticeScreen as default } from '@/features/notices/notice-screen';
