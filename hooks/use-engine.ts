import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { EngineRecord, EngineSave } from '@/shared/engine';

import { api, staleTimes } from '@/lib/api';

export const engineKeys = {
  all: ['engine'] as const,
  job: (jobId: string) => [...engineKeys.all, jobId] as const,
};

/** The engine on a job, or null before anyone has entered it. */
/** Refetch a job's engine. */
export const invalidateEngine = (queryClient: QueryClient, jobId: string) => queryClient.invalidateQueries({ queryKey: engineKeys.job(jobId) });

export function useEngineQuery(jobId: string) {
  return useQuery({
    queryKey: engineKeys.job(jobId),
    staleTime: staleTimes.record,
    queryFn: async () => (await api<{ engine: EngineRecord | null }>(`/api/jobs/${encodeURIComponent(jobId)}/engine`)).engine,
  });
}

export function useSaveEngineMutation(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (body: EngineSave) =>
      (await api<{ engine: EngineRecord }>(`/api/jobs/${encodeURIComponent(jobId)}/engine`, { method: 'PUT', body })).engine,
    onSuccess: (engine) => queryClient.setQueryData(engineKeys.job(jobId), engine),
  });
}
