import { useInfiniteQuery, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type {
  Approval,
  ApproveBody,
  OwnerDesk,
  OwnerOptionCreate,
  OwnerOptionPatch,
  OwnerPageSave,
  OwnerView,
  ShareLink,
  ShareLinkCreate,
} from '@/shared/owner';
import type { Page } from '@/shared/paging';

import { api, pagePath, staleTimes } from '@/lib/api';

const enc = encodeURIComponent;

/** The owner page's queries: the builder's desk on a job, the owner's view of it, and a signed-in owner's list. */
export const ownerPageKeys = {
  desk: (jobId: string) => ['owner-desk', jobId] as const,
  view: (base: string) => ['owner-view', base] as const,
  myJobs: ['my-jobs'] as const,
};

/** Refetch the builder's desk for a job's owner page. */
export const invalidateOwnerDesk = (queryClient: QueryClient, jobId: string) => queryClient.invalidateQueries({ queryKey: ownerPageKeys.desk(jobId) });

/** Refetch the owner's page at `base` (see ownerApiBase). */
export const invalidateOwnerView = (queryClient: QueryClient, base: string) => queryClient.invalidateQueries({ queryKey: ownerPageKeys.view(base) });

/** Refetch a signed-in owner's list of summaries. */
export const invalidateMyJobs = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: ownerPageKeys.myJobs });

/** The builder's view of the owner's page on a job. */
export function useOwnerDeskQuery(jobId: string) {
  return useQuery({
    queryKey: ownerPageKeys.desk(jobId),
    staleTime: staleTimes.record,
    queryFn: async () => (await api<{ desk: OwnerDesk }>(`/api/jobs/${enc(jobId)}/owner`)).desk,
  });
}

/** Every desk write answers with the whole desk; keep it as the cached value. */
function useDeskMutation<V>(jobId: string, send: (vars: V) => Promise<{ desk: OwnerDesk }>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: ({ desk }) => queryClient.setQueryData(ownerPageKeys.desk(jobId), desk),
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
    onSuccess: () => invalidateOwnerDesk(queryClient, jobId),
  });
}

export function useRevokeShareLinkMutation(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<{ link: ShareLink }>(`/api/share-links/${enc(id)}/revoke`, { method: 'POST' }),
    onSuccess: () => invalidateOwnerDesk(queryClient, jobId),
  });
}

/**
 * Where an owner's page lives in the API: `/api/share/<token>` for a link
 * (no account) or `/api/my/jobs/<jobId>` for a signed-in owner.
 */
export const ownerApiBase = {
  link: (token: string) => `/api/share/${enc(token)}`,
  account: (jobId: string) => `/api/my/jobs/${enc(jobId)}`,
};

export type OwnerJob = { jobId: string; vehicle: string; shopName: string; approved: boolean; paid: boolean };

/** A signed-in owner's summaries (links the shop sent to their e-mail). */
export function useMyJobsQuery() {
  return useInfiniteQuery({
    queryKey: ownerPageKeys.myJobs,
    staleTime: staleTimes.list,
    initialPageParam: null as string | null,
    queryFn: ({ pageParam }) => api<Page<'jobs', OwnerJob>>(pagePath('/api/my/jobs', pageParam)),
    getNextPageParam: (last) => last.nextCursor,
    select: (data) => data.pages.flatMap((p) => p.jobs),
  });
}

/** The owner's page at `base` (see ownerApiBase). */
export function useOwnerViewQuery(base: string) {
  return useQuery({
    queryKey: ownerPageKeys.view(base),
    staleTime: staleTimes.record,
    retry: false,
    queryFn: async () => (await api<{ view: OwnerView }>(base)).view,
  });
}

export function useApproveMutation(base: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ApproveBody) => api<{ approval: Approval }>(`${base}/approve`, { method: 'POST', body }),
    onSuccess: () => invalidateOwnerView(queryClient, base),
  });
}
