export { ErrorBoundary } from 'expo-router';
export { RootLayout as default } from '@/features/shell/root-layout';
