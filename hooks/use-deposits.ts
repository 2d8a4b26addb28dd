import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { Payment } from '@/shared/owner';

import { api } from '@/lib/api';
import { invalidateOwnerView } from '@/hooks/use-owner-page';

/**
 * The deposit on the owner page: open a payment session, and check it on the way back. The payment
 * is part of the owner's view (ownerPageKeys.view), so there is no query of its own to key.
 */
export const invalidateDeposit = (queryClient: QueryClient, base: string) => invalidateOwnerView(queryClient, base);

/** Starts the deposit: the answer is the payment page to open. */
export function useStartDepositMutation(base: string) {
  return useMutation({
    mutationFn: () => api<{ url: string }>(`${base}/deposit`, { method: 'POST' }),
  });
}

/** Back from the payment page: asks the server to check the session (the webhook usually got there first). */
export function useConfirmDepositMutation(base: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (sessionId: string) => api<{ payment: Payment }>(`${base}/deposit/confirm`, { method: 'POST', body: { sessionId } }),
    onSettled: () => invalidateDeposit(queryClient, base),
  });
}
