export { OutboxScreen as default } from '@/features/notices/outbox-screen';
