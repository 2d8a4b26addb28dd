import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { Revision, Sheet, SheetCreate, SheetSave, SheetWithHistory } from '@/shared/sheets';

import { api, staleTimes } from '@/lib/api';

export const sheetKeys = {
  all: ['sheets'] as const,
  job: (jobId: string) => [...sheetKeys.all, 'job', jobId] as const,
  detail: (id: string) => [...sheetKeys.all, 'detail', id] as const,
  revision: (id: string, number: number) => [...sheetKeys.all, 'detail', id, 'revision', number] as const,
};

export function useJobSheetsQuery(jobId: string) {
  return useQuery({
    queryKey: sheetKeys.job(jobId),
    staleTime: staleTimes.list,
    queryFn: async () => (await api<{ sheets: Sheet[] }>(`/api/jobs/${encodeURIComponent(jobId)}/sheets`)).sheets,
  });
}

export function useSheetQuery(id: string, enabled = true) {
  return useQuery({
    queryKey: sheetKeys.detail(id),
    staleTime: staleTimes.record,
    enabled,
    queryFn: async () => (await api<{ sheet: SheetWithHistory }>(`/api/sheets/${encodeURIComponent(id)}`)).sheet,
  });
}

/** One earlier revision in full (the sheet's history carries no results); off while `number` is null. */
export function useRevisionQuery(sheetId: string, number: number | null) {
  return useQuery({
    queryKey: sheetKeys.revision(sheetId, number ?? 0),
    staleTime: staleTimes.record,
    enabled: number !== null,
    queryFn: async () => (await api<{ revision: Revision }>(`/api/sheets/${encodeURIComponent(sheetId)}/revisions/${number}`)).revision,
  });
}

/** Refetch a job's sheets. */
export const invalidateJobSheets = (queryClient: QueryClient, jobId: string) => queryClient.invalidateQueries({ queryKey: sheetKeys.job(jobId) });

/** Refetch every sheet query (lists and details), for a change that touches a sheet's revisions. */
export const invalidateSheets = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: sheetKeys.all });

function useSettle() {
  const queryClient = useQueryClient();
  return (sheet: SheetWithHistory) => {
    queryClient.setQueryData(sheetKeys.detail(sheet.id), sheet);
    return invalidateJobSheets(queryClient, sheet.jobId);
  };
}

export function useCreateSheetMutation(jobId: string) {
  const settle = useSettle();
  return useMutation({
    mutationFn: async (body: SheetCreate) =>
      (await api<{ sheet: SheetWithHistory }>(`/api/jobs/${encodeURIComponent(jobId)}/sheets`, { method: 'POST', body })).sheet,
    onSuccess: settle,
  });
}

/** Saves profile values or the note; the server edits the draft or starts the next revision. */
export function useSaveSheetMutation(id: string) {
  const settle = useSettle();
  return useMutation({
    mutationFn: async (body: SheetSave) => (await api<{ sheet: SheetWithHistory }>(`/api/sheets/${encodeURIComponent(id)}`, { method: 'PATCH', body })).sheet,
    onSuccess: settle,
  });
}
