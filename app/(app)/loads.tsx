export { CalculatorScreen as default } from '@/features/shell/lazy-screens';
