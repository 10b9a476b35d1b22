import { CalculatorScreen } from '@/features/loads/calculator-screen';

export default CalculatorScreen;
