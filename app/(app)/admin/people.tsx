import { titled } from '@/components/route-title';
import { PeopleScreen } from '@/features/shell/lazy-screens';

export default titled(PeopleScreen, { page: 'People' });
