export { OperatorHome as default } from '@/features/shell/lazy-screens';
