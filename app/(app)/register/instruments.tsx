import { InstrumentRegisterScreen } from '@/features/instruments/register-screen';

export default InstrumentRegisterScreen;
