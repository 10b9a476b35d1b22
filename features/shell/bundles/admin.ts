/** Administration: its home, people and the e-mail outbox. */
export { PeopleScreen } from '@/features/admin/people-screen';
export { PersonScreen } from '@/features/admin/person-screen';
export { AdminHome } from '@/features/home/admin-home';
export { OutboxScreen } from '@/features/notices/outbox-screen';
