import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { Profile, ProfileCreate, ProfilePatch } from '@/shared/profile';

import { api, staleTimes } from '@/lib/api';

export const profileKeys = {
  all: ['profiles'] as const,
  library: () => [...profileKeys.all, 'library'] as const,
  job: (jobId: string) => [...profileKeys.all, 'job', jobId] as const,
  detail: (id: string) => [...profileKeys.all, 'detail', id] as const,
};

/** The shop's library of cam profiles. */
export function useLibraryProfilesQuery() {
  return useQuery({
    queryKey: profileKeys.library(),
    staleTime: staleTimes.list,
    queryFn: async () => (await api<{ profiles: Profile[] }>('/api/profiles')).profiles,
  });
}

/** The profiles copied into or written for one job. */
export function useJobProfilesQuery(jobId: string) {
  return useQuery({
    queryKey: profileKeys.job(jobId),
    staleTime: staleTimes.list,
    queryFn: async () => (await api<{ profiles: Profile[] }>(`/api/jobs/${encodeURIComponent(jobId)}/profiles`)).profiles,
  });
}

export function useProfileQuery(id: string) {
  return useQuery({
    queryKey: profileKeys.detail(id),
    staleTime: staleTimes.record,
    queryFn: async () => (await api<{ profile: Profile }>(`/api/profiles/${encodeURIComponent(id)}`)).profile,
  });
}

/** Refetch the list a profile is in: the job's when it belongs to one, else the library. */
export const invalidateProfileList = (queryClient: QueryClient, jobId: string | null | undefined) =>
  queryClient.invalidateQueries({ queryKey: jobId ? profileKeys.job(jobId) : profileKeys.library() });

function useSettle() {
  const queryClient = useQueryClient();
  return (profile: Profile) => {
    queryClient.setQueryData(profileKeys.detail(profile.id), profile);
    return invalidateProfileList(queryClient, profile.jobId);
  };
}

/** Adds a profile to the library, or to a job when `jobId` is given. */
export function useCreateProfileMutation(jobId?: string) {
  const settle = useSettle();
  return useMutation({
    mutationFn: async (body: ProfileCreate | { fromProfileId: string }) =>
      (
        await api<{ profile: Profile }>(jobId ? `/api/jobs/${encodeURIComponent(jobId)}/profiles` : '/api/profiles', {
          method: 'POST',
          body,
        })
      ).profile,
    onSuccess: settle,
  });
}

export function useSaveProfileMutation(id: string) {
  const settle = useSettle();
  return useMutation({
    mutationFn: async (body: ProfilePatch) => (await api<{ profile: Profile }>(`/api/profiles/${encodeURIComponent(id)}`, { method: 'PATCH', body })).profile,
    onSuccess: settle,
  });
}

export function useDeleteProfileMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api(`/api/profiles/${encodeURIComponent(id)}`, { method: 'DELETE' }),
    onSuccess: () => invalidateProfileList(queryClient, null),
  });
}
