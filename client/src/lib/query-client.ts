import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

export function makeQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // Offline on deck is normal: keep showing what we have, do not hammer a dead link.
        networkMode: 'offlineFirst',
        retry: (count, error) => !(error instanceof ApiError && error.status < 500) && count < 2,
      },
      mutations: { networkMode: 'offlineFirst' },
    },
  });
}
