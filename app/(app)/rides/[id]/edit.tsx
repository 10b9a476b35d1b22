import { objectAfter, titled } from '@/components/route-title';
import { RideEditScreen } from '@/features/shell/lazy-screens';

export default titled(RideEditScreen, { page: 'Edit ride', object: objectAfter('Edit ') });
