export { ErrorBoundary } from '@/components/route-error';
export { RootLayout as default } from '@/features/shell/root-layout';
