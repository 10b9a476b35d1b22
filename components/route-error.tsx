import { type ErrorBoundaryProps, ErrorBoundary as RouterErrorBoundary } from 'expo-router';

import { PageHead } from '@/components/page-head';
import { composeTitle } from '@/components/route-title';

/** Expo Router's error screen (with its Retry), and a browser tab that says the page failed. */
export function ErrorBoundary(props: ErrorBoundaryProps) {
  return (
    <>
      <PageHead title={composeTitle('Page could not be shown')} />
      <RouterErrorBoundary {...props} />
    </>
  );
}
