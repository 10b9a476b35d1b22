export { PersonScreen as default } from '@/features/admin/person-screen';
