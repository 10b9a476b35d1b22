export { NotFoundScreen as default } from '@/features/shell/not-found-screen';
