export { OperatorHome as default } from '@/features/home/operator-home';
