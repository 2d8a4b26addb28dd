import { useQuery } from '@tanstack/react-query';

import type { Instance } from '@/shared/instance';

import { api } from '@/lib/api';

/** The server's mode and the local fakes it runs; it does not change while the server runs. */
export function useInstanceQuery() {
  return useQuery({
    queryKey: ['instance'],
    staleTime: Infinity,
    queryFn: async () => (await api<{ instance: Instance }>('/api/instance')).instance,
  });
}
