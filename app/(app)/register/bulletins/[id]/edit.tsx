import { objectAfter, titled } from '@/components/route-title';
import { BulletinEditScreen } from '@/features/shell/lazy-screens';

export default titled(BulletinEditScreen, { page: 'Edit bulletin', object: objectAfter('Edit ') });
