import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';

import type { ShopRole } from '@/shared/roles';
import type { InvitationView, InviteInput, Team } from '@/shared/team';

import { api, staleTimes } from '@/lib/api';
import { invalidateMe } from '@/hooks/use-me';

export const teamKeys = {
  team: ['team'] as const,
  invitation: (id: string) => ['invitation', id] as const,
};

/** Refetch the shop's staff and invitations. */
export const invalidateTeam = (queryClient: QueryClient) => queryClient.invalidateQueries({ queryKey: teamKeys.team });

/** The shop's staff and open invitations (builders of a repair shop, grinders of a grinding shop). */
export function useTeamQuery() {
  return useQuery({ queryKey: teamKeys.team, staleTime: staleTimes.record, queryFn: () => api<Team>('/api/shop/team') });
}

/** Every team change answers with the whole team, which replaces the cached one. */
function useTeamChange<V>(call: (vars: V) => Promise<Team>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: call, onSuccess: (team) => queryClient.setQueryData(teamKeys.team, team) });
}

export const useInviteMutation = () => useTeamChange((body: InviteInput) => api<Team>('/api/shop/invitations', { method: 'POST', body }));

export const useWithdrawInvitationMutation = () =>
  useTeamChange((id: string) => api<Team>(`/api/shop/invitations/${encodeURIComponent(id)}`, { method: 'DELETE' }));

export const useChangeRoleMutation = () =>
  useTeamChange(({ memberId, role }: { memberId: string; role: ShopRole }) =>
    api<Team>(`/api/shop/members/${encodeURIComponent(memberId)}`, { method: 'PATCH', body: { role } }),
  );

export const useRemoveMemberMutation = () =>
  useTeamChange((memberId: string) => api<Team>(`/api/shop/members/${encodeURIComponent(memberId)}`, { method: 'DELETE' }));

/** An invitation as the signed-in person it was sent to sees it. */
export function useInvitationQuery(id: string, enabled: boolean) {
  return useQuery({
    queryKey: teamKeys.invitation(id),
    enabled,
    retry: false,
    queryFn: () => api<InvitationView>(`/api/invitations/${encodeURIComponent(id)}`),
  });
}

/** Accepts or declines; accepting opens the shop, so who the person is gets read again. */
export function useAnswerInvitationMutation(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (answer: 'accept' | 'decline') => api<InvitationView>(`/api/invitations/${encodeURIComponent(id)}/${answer}`, { method: 'POST' }),
    onSuccess: async (view) => {
      queryClient.setQueryData(teamKeys.invitation(id), view);
      await invalidateMe(queryClient);
    },
  });
}
