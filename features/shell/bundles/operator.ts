/** The ride operator's home. */
export { OperatorHome } from '@/features/home/operator-home';
