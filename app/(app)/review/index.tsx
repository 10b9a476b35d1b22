import { SupervisorHome } from '@/features/home/supervisor-home';

export default SupervisorHome;
