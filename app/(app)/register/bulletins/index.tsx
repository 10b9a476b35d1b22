import { titled } from '@/components/route-title';
import { BulletinsListScreen } from '@/features/shell/lazy-screens';

export default titled(BulletinsListScreen, { page: 'Bulletins' });
