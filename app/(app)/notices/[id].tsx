import { NoticeScreen } from '@/features/notices/notice-screen';

export default NoticeScreen;
