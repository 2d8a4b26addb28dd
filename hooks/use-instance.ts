import { useQuery, type QueryClient } from '@tanstack/react-query';

import type { Instance } from '@/shared/instance';

import { api } from '@/lib/api';

export const instanceKeys = { all: ['instance'] as const };

/** Refetch the server's mode and fakes (they change only when the server restarts). */
export const invalidateInstance = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: instanceKeys.all });

/** The server's mode and the local fakes it runs; it does not change while the server runs. */
export function useInstanceQuery() {
  return useQuery({
    queryKey: instanceKeys.all,
    staleTime: Infinity,
    queryFn: async () => (await api<{ instance: Instance }>('/api/instance')).instance,
  });
}
