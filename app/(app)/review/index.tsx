import { titled } from '@/components/route-title';
import { QueueScreen } from '@/features/shell/lazy-screens';

export default titled(QueueScreen, { page: 'Review' });
