import { AdminHome } from '@/features/home/admin-home';

export default AdminHome;
