export { InstrumentRegisterScreen as default } from '@/features/instruments/register-screen';
