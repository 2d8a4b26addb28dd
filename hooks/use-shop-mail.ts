import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { FailedMail } from '@/shared/orders';

import { api, staleTimes } from '@/lib/api';

export const shopMailKeys = {
  failures: ['shop-mail-failures'] as const,
};

type Failures = { failures: FailedMail[] };

/** Refetch the shop's undelivered mail. */
export const invalidateShopMail = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: shopMailKeys.failures });

/** Mail about the shop that could not be sent after every try (builders of a repair shop, grinders of a grinding shop). */
export function useMailFailuresQuery() {
  return useQuery({ queryKey: shopMailKeys.failures, staleTime: staleTimes.record, queryFn: () => api<Failures>('/api/shop/mail-failures') });
}

/** Puts one undelivered mail back in line; the answer replaces the cached list. */
export function useRetryMailMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<Failures>(`/api/shop/mail-failures/${encodeURIComponent(id)}/retry`, { method: 'POST' }),
    onSuccess: (answer) => queryClient.setQueryData(shopMailKeys.failures, answer),
  });
}
