import { titled } from '@/components/route-title';
import { AccountScreen } from '@/features/shell/lazy-screens';

export default titled(AccountScreen, { page: 'Account' });
