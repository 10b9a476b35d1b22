export { PeopleScreen as default } from '@/features/shell/lazy-screens';
