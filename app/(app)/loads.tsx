import { CalculatorScreen } from '@/features/calculator/calculator-screen';

export default CalculatorScreen;
