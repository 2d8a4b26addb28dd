import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { FitCheckRun } from '@/shared/measurements';

import { api, staleTimes } from '@/lib/api';

export const fitCheckKeys = {
  all: ['fit-checks'] as const,
  sheet: (sheetId: string) => [...fitCheckKeys.all, 'sheet', sheetId] as const,
};

/** Earlier runs on a sheet, newest first. */
/** Refetch a sheet's fit-check runs. */
export const invalidateFitChecks = (queryClient: QueryClient, sheetId: string) => queryClient.invalidateQueries({ queryKey: fitCheckKeys.sheet(sheetId) });

export function useFitCheckRunsQuery(sheetId: string | null) {
  return useQuery({
    queryKey: fitCheckKeys.sheet(sheetId ?? ''),
    staleTime: staleTimes.list,
    enabled: sheetId !== null,
    queryFn: async () => {
      const runs = (await api<{ runs: FitCheckRun[] }>(`/api/sheets/${encodeURIComponent(sheetId ?? '')}/fit-checks`)).runs;
      return [...runs].sort((a, b) => (a.createdAt < b.createdAt ? 1 : a.createdAt > b.createdAt ? -1 : 0));
    },
  });
}

/** Runs every check against the sheet's current revision with the job's measurements and the shop's limits. */
export function useRunFitChecksMutation(sheetId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async () => (await api<{ run: FitCheckRun }>(`/api/sheets/${encodeURIComponent(sheetId)}/fit-checks`, { method: 'POST', body: {} })).run,
    onSuccess: () => invalidateFitChecks(queryClient, sheetId),
  });
}
