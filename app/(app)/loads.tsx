export { CalculatorScreen as default } from '@/features/calculator/calculator-screen';
