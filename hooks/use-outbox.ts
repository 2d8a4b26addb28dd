import { useQuery, type QueryClient } from '@tanstack/react-query';

import type { OutboxMessage } from '@/shared/orders';

import { api, ApiError, staleTimes } from '@/lib/api';

export const outboxKeys = {
  all: ['outbox'] as const,
  list: () => [...outboxKeys.all, 'list'] as const,
  detail: (id: string) => [...outboxKeys.all, 'detail', id] as const,
};

/**
 * The local outbox (dev mail transport). Answers null when the server has no
 * mailbox: a server run with NODE_ENV=production answers 404, so callers hide the screen.
 * The server decides, not the bundle: `expo export` always bundles with NODE_ENV=production,
 * even for the build a developer serves locally with the outbox on.
 */
/** Refetch the development mailbox. */
export const invalidateOutbox = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: outboxKeys.all });

export function useOutboxQuery(enabled = true) {
  return useQuery({
    queryKey: outboxKeys.list(),
    staleTime: staleTimes.record,
    enabled,
    retry: false,
    queryFn: async (): Promise<OutboxMessage[] | null> => {
      try {
        return (await api<{ messages: OutboxMessage[] }>('/api/dev/outbox')).messages;
      } catch (error) {
        if (error instanceof ApiError && error.status === 404) return null;
        throw error;
      }
    },
  });
}

export function useOutboxMessageQuery(id: string | null) {
  return useQuery({
    queryKey: outboxKeys.detail(id ?? ''),
    staleTime: staleTimes.session,
    enabled: id !== null,
    queryFn: async () => (await api<{ message: OutboxMessage }>(`/api/dev/outbox/${encodeURIComponent(id ?? '')}`)).message,
  });
}
