import { NoticeListScreen } from '@/features/notices/notice-list-screen';

export default NoticeListScreen;
