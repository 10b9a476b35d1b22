import { NotFoundScreen } from '@/features/shell/not-found-screen';

export default NotFoundScreen;
