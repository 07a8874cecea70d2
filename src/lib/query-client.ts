import { QueryCache, QueryClient } from '@tanstack/react-query';
import { isUnauthenticated } from './api-error';

/** Queries retry transient failures twice, never a 4xx; a 401 anywhere clears the signed-in user. */
export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (isUnauthenticated(error)) client.setQueryData(['me'], null);
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 15_000,
        retry: (failures, error) => failures < 2 && !(error as { status?: number }).status,
        refetchOnWindowFocus: true,
      },
    },
  });
  return client;
}
