export { NoticeScreen as default } from '@/features/shell/lazy-screens';
