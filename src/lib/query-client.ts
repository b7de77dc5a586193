import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api';

/** The one QueryClient of the app. Client errors (4xx) are not worth retrying. */
export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      staleTime: 10_000,
      retry: (failureCount, error) =>
        !(error instanceof ApiError && error.status >= 400 && error.status < 500) && failureCount < 2,
    },
  },
});
