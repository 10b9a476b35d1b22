export { InstrumentRegisterScreen as default } from '@/features/shell/lazy-screens';
