export { StartRedirect as default } from '@/features/auth/start-redirect';
