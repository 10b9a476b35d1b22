import { QueueScreen } from '@/features/review/queue-screen';

export default QueueScreen;
