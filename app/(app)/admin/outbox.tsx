import { OutboxScreen } from '@/features/notices/outbox-screen';

export default OutboxScreen;
