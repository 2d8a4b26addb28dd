import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { ShopLimitsResponse, ShopLimitsSave } from '@/shared/measurements';

import { api, staleTimes } from '@/lib/api';

/** The overrides and version, every rule as it applies (with its source), and calc's defaults. */
export type ShopLimitsAnswer = ShopLimitsResponse;

export const shopLimitKeys = { all: ['shop-limits'] as const };

/** The shop's own limits, its version, and the limits the checks use (defaults merged, each with its source). */
/** Refetch the shop's limits. */
export const invalidateShopLimits = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: shopLimitKeys.all });

export function useShopLimitsQuery() {
  return useQuery({
    queryKey: shopLimitKeys.all,
    staleTime: staleTimes.record,
    queryFn: () => api<ShopLimitsAnswer>('/api/shop/limits'),
  });
}

/** Saves the whole set of overrides; a stale version is a 409. Builders only. */
export function useSaveShopLimitsMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ShopLimitsSave) => api<ShopLimitsAnswer>('/api/shop/limits', { method: 'PUT', body }),
    onSuccess: (answer) => {
      queryClient.setQueryData(shopLimitKeys.all, answer);
      return invalidateShopLimits(queryClient);
    },
  });
}
