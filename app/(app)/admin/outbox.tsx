import { titled } from '@/components/route-title';
import { OutboxScreen } from '@/features/shell/lazy-screens';

export default titled(OutboxScreen, { page: 'Outbox' });
