export { AppLayout as default } from '@/features/shell/app-layout';
