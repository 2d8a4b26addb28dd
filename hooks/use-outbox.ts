import { useQuery } from '@tanstack/react-query';

import type { OutboxMessage } from '@/shared/orders';

import { api, ApiError, staleTimes } from './api';

export const outboxKeys = {
  all: ['outbox'] as const,
  list: () => [...outboxKeys.all, 'list'] as const,
  detail: (id: string) => [...outboxKeys.all, 'detail', id] as const,
};

/** True in a development build; the dev mailbox never shows in production. */
export const mailboxBuild = process.env.NODE_ENV !== 'production';

/**
 * The local outbox (dev mail transport). Answers null when the server has no
 * mailbox (404 in production), so callers can hide the screen.
 */
export function useOutboxQuery(enabled = mailboxBuild) {
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
    enabled: mailboxBuild && id !== null,
    queryFn: async () => (await api<{ message: OutboxMessage }>(`/api/dev/outbox/${encodeURIComponent(id ?? '')}`)).message,
  });
}
