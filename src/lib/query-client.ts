import { QueryClient } from '@tanstack/react-query';
import { isApiError } from './api';

/** One query client for the app: no retries on 4xx (they will not heal), short retries otherwise. */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 15_000,
        refetchOnWindowFocus: false,
        retry: (count, error) => {
          if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
          return count < 2;
        },
      },
      mutations: { retry: false },
    },
  });
}
