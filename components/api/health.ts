import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from './client';

export const healthKeys = {
  all: ['health'] as const,
};

export const healthQueryOptions = queryOptions({
  queryKey: healthKeys.all,
  // 503 carries a valid body that says which part is down.
  queryFn: ({ signal }) =>
    apiRequest('/api/health', (k) => k.healthSchema, { signal, acceptStatuses: [503] }),
  refetchInterval: 30_000,
});

export function useHealthQuery() {
  return useQuery(healthQueryOptions);
}
