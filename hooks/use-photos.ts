import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { Photo } from '@/shared/measurements';

import { api, staleTimes, upload } from '@/lib/api';
import { appendPickedFile, type PickedFile } from '@/lib/form-file';

export const photoKeys = {
  all: ['photos'] as const,
  job: (jobId: string) => [...photoKeys.all, 'job', jobId] as const,
};

export function useJobPhotosQuery(jobId: string) {
  return useQuery({
    queryKey: photoKeys.job(jobId),
    staleTime: staleTimes.list,
    queryFn: async () => (await api<{ photos: Photo[] }>(`/api/jobs/${encodeURIComponent(jobId)}/photos`)).photos,
  });
}

/** Refetch a job's photos. */
export const invalidatePhotos = (queryClient: QueryClient, jobId: string) => queryClient.invalidateQueries({ queryKey: photoKeys.job(jobId) });

function useSettle(jobId: string) {
  const queryClient = useQueryClient();
  return () => invalidatePhotos(queryClient, jobId);
}

/** Sends up to six photos in one request (multipart field `photos`, as the server names it). */
export function useUploadPhotosMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: async (files: readonly PickedFile[]) => {
      const form = new FormData();
      for (const file of files) appendPickedFile(form, 'photos', file);
      return (await upload<{ photos: Photo[] }>(`/api/jobs/${encodeURIComponent(jobId)}/photos`, form)).photos;
    },
    onSuccess: settle,
  });
}

export function useSavePhotoMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: async ({ id, ...body }: { id: string; caption?: string; shareable?: boolean }) =>
      (await api<{ photo: Photo }>(`/api/photos/${encodeURIComponent(id)}`, { method: 'PATCH', body })).photo,
    onSuccess: settle,
  });
}

export function useDeletePhotoMutation(jobId: string) {
  const settle = useSettle(jobId);
  return useMutation({
    mutationFn: (id: string) => api(`/api/photos/${encodeURIComponent(id)}`, { method: 'DELETE' }),
    onSuccess: settle,
  });
}
