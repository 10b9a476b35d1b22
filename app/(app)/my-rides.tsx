import { OperatorHome } from '@/features/home/operator-home';

export default OperatorHome;
