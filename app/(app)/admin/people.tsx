export { PeopleScreen as default } from '@/features/admin/people-screen';
