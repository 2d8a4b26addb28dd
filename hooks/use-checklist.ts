import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { ChecklistItem } from '@/shared/measurements';

import { api, staleTimes } from '@/lib/api';

export const checklistKeys = {
  all: ['checklist'] as const,
  job: (jobId: string) => [...checklistKeys.all, 'job', jobId] as const,
};

export function useChecklistQuery(jobId: string) {
  return useQuery({
    queryKey: checklistKeys.job(jobId),
    staleTime: staleTimes.list,
    queryFn: async () => (await api<{ items: ChecklistItem[] }>(`/api/jobs/${encodeURIComponent(jobId)}/checklist`)).items,
  });
}

/** Refetch a job's checklist. */
export const invalidateChecklist = (queryClient: QueryClient, jobId: string) => queryClient.invalidateQueries({ queryKey: checklistKeys.job(jobId) });

function useSettle(jobId: string) {
  const queryClient = useQueryClient();
  return () => invalidateChecklist(queryClient, jobId);
}

export function useAddChecklistItemMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: async (label: string) =>
      (await api<{ item: ChecklistItem }>(`/api/jobs/${encodeURIComponent(jobId)}/checklist`, { method: 'POST', body: { label } })).item,
    onSuccess: settle,
  });
}

/** Ticks or unticks an item; the server records who and when. */
export function useTickChecklistItemMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: async ({ id, done }: { id: string; done: boolean }) =>
      (await api<{ item: ChecklistItem }>(`/api/checklist/${encodeURIComponent(id)}`, { method: 'PATCH', body: { done } })).item,
    onSuccess: settle,
  });
}

export function useRemoveChecklistItemMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: (id: string) => api(`/api/checklist/${encodeURIComponent(id)}`, { method: 'DELETE' }),
    onSuccess: settle,
  });
}
