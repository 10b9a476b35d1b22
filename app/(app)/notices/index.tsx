export { NoticeListScreen as default } from '@/features/shell/lazy-screens';
