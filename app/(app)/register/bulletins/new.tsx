import { titled } from '@/components/route-title';
import { BulletinEditScreen } from '@/features/shell/lazy-screens';

export default titled(BulletinEditScreen, { page: 'New bulletin' });
