import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { Me, ShopCreate } from '@/shared/me';

import { api, ApiError, staleTimes } from '@/lib/api';

export const meKeys = { all: ['me'] as const };

/** Refetch who is signed in (their shops, role, verification). */
export const invalidateMe = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: meKeys.all });

/** The signed-in person, or null when nobody is signed in. */
export function useMeQuery() {
  return useQuery({
    queryKey: meKeys.all,
    staleTime: staleTimes.session,
    retry: false,
    queryFn: async (): Promise<Me | null> => {
      try {
        return await api<Me>('/api/me');
      } catch (error) {
        if (error instanceof ApiError && error.status === 401) return null;
        throw error;
      }
    },
  });
}

/** Forgets every cached record, so nothing of one person or shop shows to the next. */
function useResetAll() {
  const queryClient = useQueryClient();
  return async () => {
    queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== meKeys.all[0] });
    await invalidateMe(queryClient);
  };
}

export function useSignInMutation() {
  const reset = useResetAll();
  return useMutation({
    mutationFn: (body: { email: string; password: string }) => api('/api/auth/sign-in/email', { method: 'POST', body }),
    onSuccess: reset,
  });
}

export function useSignUpMutation() {
  const reset = useResetAll();
  return useMutation({
    /** With a shop, the new account founds it; without one, the person waits for a shop's invitation to open once they verify. */
    mutationFn: async (body: { name: string; email: string; password: string; shop: ShopCreate | null }) => {
      await api('/api/auth/sign-up/email', {
        method: 'POST',
        body: { name: body.name, email: body.email, password: body.password },
      });
      return body.shop ? api<Me>('/api/shops', { method: 'POST', body: body.shop }) : null;
    },
    onSuccess: reset,
  });
}

export function useSignOutMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api('/api/auth/sign-out', { method: 'POST', body: {} }),
    onSuccess: () => {
      queryClient.setQueryData(meKeys.all, null);
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== meKeys.all[0] });
    },
  });
}

export function useCreateShopMutation() {
  const reset = useResetAll();
  return useMutation({
    mutationFn: (body: ShopCreate) => api<Me>('/api/shops', { method: 'POST', body }),
    onSuccess: reset,
  });
}

export function useSwitchShopMutation() {
  const reset = useResetAll();
  return useMutation({
    mutationFn: (shopId: string) => api<Me>('/api/me/active-shop', { method: 'POST', body: { shopId } }),
    onSuccess: reset,
  });
}

/** Mails the signed-in person a new verification link. */
export function useResendVerificationMutation() {
  return useMutation({
    mutationFn: (email: string) => api('/api/auth/send-verification-email', { method: 'POST', body: { email, callbackURL: '/verified' } }),
  });
}

/** Mails a set-new-password link to the address, if it has an account (the answer is the same either way). */
export function useRequestPasswordResetMutation() {
  return useMutation({
    mutationFn: (email: string) => api('/api/auth/request-password-reset', { method: 'POST', body: { email, redirectTo: '/reset-password' } }),
  });
}

/** Sets a new password with the token from the reset link. */
export function useResetPasswordMutation() {
  return useMutation({
    mutationFn: (body: { token: string; newPassword: string }) => api('/api/auth/reset-password', { method: 'POST', body }),
  });
}
