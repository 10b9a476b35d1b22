export { InspectRoute as default } from '@/features/shell/lazy-screens';
