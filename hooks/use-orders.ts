import { useInfiniteQuery, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { ConfirmOrderBody, IssueBody, Order, OrderDetail, OrderMessage, OrderMove } from '@/shared/orders';
import type { Page } from '@/shared/paging';

import { api, pagePath, staleTimes } from '@/lib/api';
import { invalidateSheets, sheetKeys } from '@/hooks/use-sheets';

export type GrindingShop = { id: string; name: string };

export const orderKeys = {
  all: ['orders'] as const,
  sheet: (sheetId: string) => [...orderKeys.all, 'sheet', sheetId] as const,
  incoming: () => [...orderKeys.all, 'incoming'] as const,
  detail: (id: string) => [...orderKeys.all, 'detail', id] as const,
  messages: (id: string) => [...orderKeys.all, 'messages', id] as const,
  grindingShops: ['grinding-shops'] as const,
};

const enc = encodeURIComponent;

/** Grinding shops a builder can send a sheet to. */
export function useGrindingShopsQuery(enabled = true) {
  return useQuery({
    queryKey: orderKeys.grindingShops,
    staleTime: staleTimes.session,
    enabled,
    queryFn: async () => (await api<{ shops: GrindingShop[] }>('/api/grinding-shops')).shops,
  });
}

/** The orders issued from one spec sheet (repair shop side). */
export function useSheetOrdersQuery(sheetId: string) {
  return useQuery({
    queryKey: orderKeys.sheet(sheetId),
    staleTime: staleTimes.list,
    queryFn: async () => (await api<{ orders: Order[] }>(`/api/sheets/${enc(sheetId)}/orders`)).orders,
  });
}

/** The grinding shop's inbox: orders issued to it. */
export function useIncomingQuery(enabled = true) {
  return useInfiniteQuery({
    queryKey: orderKeys.incoming(),
    staleTime: staleTimes.list,
    enabled,
    initialPageParam: null as string | null,
    queryFn: ({ pageParam }) => api<Page<'orders', Order>>(pagePath('/api/incoming', pageParam)),
    getNextPageParam: (last) => last.nextCursor,
    select: (data) => data.pages.flatMap((p) => p.orders),
  });
}

export function useOrderQuery(id: string) {
  return useQuery({
    queryKey: orderKeys.detail(id),
    staleTime: staleTimes.record,
    queryFn: async () => (await api<{ order: OrderDetail }>(`/api/orders/${enc(id)}`)).order,
  });
}

/** Refetch an order and its thread. */
export const invalidateOrder = (queryClient: QueryClient, id: string) =>
  Promise.all([queryClient.invalidateQueries({ queryKey: orderKeys.messages(id) }), queryClient.invalidateQueries({ queryKey: orderKeys.detail(id) })]);

/** Refetch the lists an order appears in (its sheet's orders, incoming) and its thread. */
export const invalidateOrderLists = (queryClient: QueryClient, order: { id: string; sheetId: string }) =>
  Promise.all([
    queryClient.invalidateQueries({ queryKey: orderKeys.sheet(order.sheetId) }),
    queryClient.invalidateQueries({ queryKey: orderKeys.incoming() }),
    queryClient.invalidateQueries({ queryKey: orderKeys.messages(order.id) }),
  ]);

function useSettleOrder() {
  const queryClient = useQueryClient();
  return (order: OrderDetail) => {
    queryClient.setQueryData(orderKeys.detail(order.id), order);
    return invalidateOrderLists(queryClient, order);
  };
}

/** Issues the sheet's current draft revision to one grinding shop; the revision is frozen from then on. */
export function useIssueSheetMutation(sheetId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (body: IssueBody) => (await api<{ order: Order }>(`/api/sheets/${enc(sheetId)}/issue`, { method: 'POST', body })).order,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: sheetKeys.detail(sheetId) }),
        queryClient.invalidateQueries({ queryKey: orderKeys.sheet(sheetId) }),
        invalidateSheets(queryClient),
      ]),
  });
}

/** Moves an order to its next stage (quote, ask for changes, grind, ship, receive, install). */
export function useMoveOrderMutation(id: string) {
  const settle = useSettleOrder();
  return useMutation({
    mutationFn: async (body: OrderMove) => (await api<{ order: OrderDetail }>(`/api/orders/${enc(id)}/move`, { method: 'POST', body })).order,
    onSuccess: settle,
  });
}

/** A builder makes a request for a quote the job's firm order without the owner, with a reason. */
export function useConfirmOrderMutation(id: string) {
  const settle = useSettleOrder();
  return useMutation({
    mutationFn: async (body: ConfirmOrderBody) => (await api<{ order: OrderDetail }>(`/api/orders/${enc(id)}/confirm`, { method: 'POST', body })).order,
    onSuccess: settle,
  });
}

export function useOrderMessagesQuery(id: string) {
  return useQuery({
    queryKey: orderKeys.messages(id),
    staleTime: staleTimes.record,
    queryFn: async () => (await api<{ messages: OrderMessage[] }>(`/api/orders/${enc(id)}/messages`)).messages,
  });
}

export function useSendMessageMutation(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (body: { body: string }) => (await api<{ message: OrderMessage }>(`/api/orders/${enc(id)}/messages`, { method: 'POST', body })).message,
    onSuccess: () => invalidateOrder(queryClient, id),
  });
}
