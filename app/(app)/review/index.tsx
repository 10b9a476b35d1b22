export { QueueScreen as default } from '@/features/review/queue-screen';
