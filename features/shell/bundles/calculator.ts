/** The load calculator. */
export { CalculatorScreen } from '@/features/calculator/calculator-screen';
