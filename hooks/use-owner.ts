import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import type { Approval, ApproveBody, OwnerDesk, OwnerOptionCreate, OwnerOptionPatch, OwnerPageSave, OwnerView, Payment, ShareLink, ShareLinkCreate } from '@/shared/owner';

import { api, staleTimes } from './api';

const enc = encodeURIComponent;

export const ownerKeys = {
  desk: (jobId: string) => ['owner-desk', jobId] as const,
  view: (token: string) => ['owner-view', token] as const,
};

/** The builder's view of the owner's page on a job. */
export function useOwnerDeskQuery(jobId: string) {
  return useQuery({
    queryKey: ownerKeys.desk(jobId),
    staleTime: staleTimes.record,
    queryFn: async () => (await api<{ desk: OwnerDesk }>(`/api/jobs/${enc(jobId)}/owner`)).desk,
  });
}

/** Every desk write answers with the whole desk; keep it as the cached value. */
function useDeskMutation<V>(jobId: string, send: (vars: V) => Promise<{ desk: OwnerDesk }>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: ({ desk }) => queryClient.setQueryData(ownerKeys.desk(jobId), desk),
  });
}

export function useSaveOwnerPageMutation(jobId: string) {
  return useDeskMutation(jobId, (body: OwnerPageSave) => api<{ desk: OwnerDesk }>(`/api/jobs/${enc(jobId)}/owner`, { method: 'PUT', body }));
}

export function useAddOwnerOptionMutation(jobId: string) {
  return useDeskMutation(jobId, (body: OwnerOptionCreate) => api<{ desk: OwnerDesk }>(`/api/jobs/${enc(jobId)}/owner/options`, { method: 'POST', body }));
}

export function useSaveOwnerOptionMutation(jobId: string) {
  return useDeskMutation(jobId, ({ id, ...body }: OwnerOptionPatch & { id: string }) =>
    api<{ desk: OwnerDesk }>(`/api/owner-options/${enc(id)}`, { method: 'PATCH', body }),
  );
}

export function useRemoveOwnerOptionMutation(jobId: string) {
  return useDeskMutation(jobId, (id: string) => api<{ desk: OwnerDesk }>(`/api/owner-options/${enc(id)}`, { method: 'DELETE' }));
}

export type NewShareLink = { link: ShareLink; token: string; url: string; emailed: boolean };

export function useCreateShareLinkMutation(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ShareLinkCreate) => api<NewShareLink>(`/api/jobs/${enc(jobId)}/share-links`, { method: 'POST', body }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ownerKeys.desk(jobId) }),
  });
}

export function useRevokeShareLinkMutation(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<{ link: ShareLink }>(`/api/share-links/${enc(id)}/revoke`, { method: 'POST' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ownerKeys.desk(jobId) }),
  });
}

/** The owner's page from a share link (no account). */
export function useOwnerViewQuery(token: string) {
  return useQuery({
    queryKey: ownerKeys.view(token),
    staleTime: staleTimes.record,
    retry: false,
    queryFn: async () => (await api<{ view: OwnerView }>(`/api/share/${enc(token)}`)).view,
  });
}

export function useApproveMutation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ApproveBody) => api<{ approval: Approval }>(`/api/share/${enc(token)}/approve`, { method: 'POST', body }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ownerKeys.view(token) }),
  });
}

/** Starts the deposit: the answer is the payment page to open. */
export function useStartDepositMutation(token: string) {
  return useMutation({
    mutationFn: () => api<{ url: string }>(`/api/share/${enc(token)}/deposit`, { method: 'POST' }),
  });
}

/** Back from the payment page: asks the server to check the session (the webhook usually got there first). */
export function useConfirmDepositMutation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (sessionId: string) => api<{ payment: Payment }>(`/api/share/${enc(token)}/deposit/confirm`, { method: 'POST', body: { sessionId } }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: ownerKeys.view(token) }),
  });
}
