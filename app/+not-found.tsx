import { titled } from '@/components/route-title';
import { NotFoundScreen } from '@/features/shell/not-found-screen';

export default titled(NotFoundScreen, { page: 'Page not found' });
