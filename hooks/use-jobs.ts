import { useInfiniteQuery, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { Job, JobCreate, JobPatch } from '@/shared/jobs';
import type { Lifecycle } from '@/shared/lifecycle';
import type { Page } from '@/shared/paging';

import { api, pagePath, staleTimes } from '@/lib/api';

export const jobKeys = {
  all: ['jobs'] as const,
  list: () => [...jobKeys.all, 'list'] as const,
  detail: (id: string) => [...jobKeys.all, 'detail', id] as const,
  lifecycle: (id: string) => [...jobKeys.all, 'lifecycle', id] as const,
};

/** The shop's jobs, newest change first, a page at a time (`fetchNextPage` for more); `data` is every job loaded so far. */
/** Refetch the jobs list (every page loaded so far). */
export const invalidateJobList = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: jobKeys.list() });

export function useJobsQuery(enabled = true) {
  return useInfiniteQuery({
    queryKey: jobKeys.list(),
    staleTime: staleTimes.list,
    enabled,
    initialPageParam: null as string | null,
    queryFn: ({ pageParam }) => api<Page<'jobs', Job>>(pagePath('/api/jobs', pageParam)),
    getNextPageParam: (last) => last.nextCursor,
    select: (data) => data.pages.flatMap((p) => p.jobs),
  });
}

export function useJobQuery(id: string) {
  return useQuery({
    queryKey: jobKeys.detail(id),
    staleTime: staleTimes.record,
    queryFn: async () => (await api<{ job: Job }>(`/api/jobs/${encodeURIComponent(id)}`)).job,
  });
}

/**
 * The job's stages, read from its records on the server. Orders, approvals, measurements and fit checks all move
 * it, from other screens and other people, so it is refetched whenever the job screen is opened again.
 */
export function useLifecycleQuery(id: string) {
  return useQuery({
    queryKey: jobKeys.lifecycle(id),
    staleTime: 0,
    queryFn: async () => (await api<{ lifecycle: Lifecycle }>(`/api/jobs/${encodeURIComponent(id)}/lifecycle`)).lifecycle,
  });
}

export function useCreateJobMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (body: JobCreate) => (await api<{ job: Job }>('/api/jobs', { method: 'POST', body })).job,
    onSuccess: (job) => {
      queryClient.setQueryData(jobKeys.detail(job.id), job);
      return invalidateJobList(queryClient);
    },
  });
}

export function useSaveJobMutation(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (body: JobPatch) => (await api<{ job: Job }>(`/api/jobs/${encodeURIComponent(id)}`, { method: 'PATCH', body })).job,
    onSuccess: (job) => {
      queryClient.setQueryData(jobKeys.detail(job.id), job);
      // Findings and the stage are read into the job's lifecycle.
      void queryClient.invalidateQueries({ queryKey: jobKeys.lifecycle(job.id) });
      return invalidateJobList(queryClient);
    },
  });
}
