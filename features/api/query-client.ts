import { QueryClient } from '@tanstack/react-query';

import { ApiRequestError, OfflineError } from '@/lib/api-errors';

/** Client errors (4xx) will not get better by retrying; connection errors might. */
export function makeQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        retry: (count, err) => {
          if (err instanceof ApiRequestError && err.status < 500) return false;
          if (err instanceof OfflineError) return false;
          return count < 2;
        },
        networkMode: 'offlineFirst',
      },
      mutations: { networkMode: 'always' },
    },
  });
}
