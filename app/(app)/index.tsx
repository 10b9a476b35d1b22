import { titled } from '@/components/route-title';
import { StartRedirect } from '@/features/auth/start-redirect';

export default titled(StartRedirect, { page: 'Start' });
