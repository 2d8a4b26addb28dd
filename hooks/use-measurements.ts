import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { Measurement, MeasurementCreate, MeasurementKind } from '@/shared/measurements';

import { api, staleTimes, upload } from '@/lib/api';
import { appendPickedFile, type PickedFile } from '@/lib/form-file';

export const measurementKeys = {
  all: ['measurements'] as const,
  job: (jobId: string) => [...measurementKeys.all, 'job', jobId] as const,
  detail: (id: string) => [...measurementKeys.all, 'detail', id] as const,
};

/** Every measurement recorded on a job, oldest first. */
export function useJobMeasurementsQuery(jobId: string) {
  return useQuery({
    queryKey: measurementKeys.job(jobId),
    staleTime: staleTimes.list,
    queryFn: async () => (await api<{ measurements: Measurement[] }>(`/api/jobs/${encodeURIComponent(jobId)}/measurements`)).measurements,
  });
}

/** The latest measurement of one kind on a job, from a list the caller already holds. */
export function latestOfKind<K extends MeasurementKind>(list: readonly Measurement[] | undefined, kind: K): Measurement<K> | null {
  const found = (list ?? []).filter((m): m is Measurement<K> => m.kind === kind);
  found.sort((a, b) => (a.updatedAt < b.updatedAt ? 1 : a.updatedAt > b.updatedAt ? -1 : 0));
  return found[0] ?? null;
}

/** Refetch a job's measurements. */
export const invalidateMeasurements = (queryClient: QueryClient, jobId: string) => queryClient.invalidateQueries({ queryKey: measurementKeys.job(jobId) });

function useSettle(jobId: string) {
  const queryClient = useQueryClient();
  return () => invalidateMeasurements(queryClient, jobId);
}

export function useCreateMeasurementMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: async (body: MeasurementCreate) =>
      (await api<{ measurement: Measurement }>(`/api/jobs/${encodeURIComponent(jobId)}/measurements`, { method: 'POST', body })).measurement,
    onSuccess: settle,
  });
}

/** Replaces a measurement's data and note; a stale version is a 409. */
export function useSaveMeasurementMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: async ({ id, ...body }: { id: string; version: number; note?: string; data: unknown }) =>
      (await api<{ measurement: Measurement }>(`/api/measurements/${encodeURIComponent(id)}`, { method: 'PATCH', body })).measurement,
    onSuccess: settle,
  });
}

export function useDeleteMeasurementMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: (id: string) => api(`/api/measurements/${encodeURIComponent(id)}`, { method: 'DELETE' }),
    onSuccess: settle,
  });
}

/** Uploads a lobe table (CSV) as one measurement; a bad file is a 400 naming its row and column. */
export function useUploadLobesMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: async (file: PickedFile) => {
      const form = new FormData();
      appendPickedFile(form, 'file', file);
      return (await upload<{ measurement: Measurement<'lobes'> }>(`/api/jobs/${encodeURIComponent(jobId)}/measurements/lobes`, form)).measurement;
    },
    onSuccess: settle,
  });
}
