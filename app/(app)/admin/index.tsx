export { AdminHome as default } from '@/features/home/admin-home';
