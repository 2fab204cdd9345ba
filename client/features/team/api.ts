import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  InviteInput,
  PendingInvitation,
  TeamMember,
  TeamPage,
  TeamPatchInput,
} from '../../../shared/schemas/team';
import type { InvitationResponse } from '../../../shared/schemas/invitations';
import { http } from '../../lib/http';

export const teamKeys = {
  all: ['team'] as const,
  list: (page: number) => ['team', 'list', page] as const,
  invitations: ['team', 'invitations'] as const,
};

export const fetchTeam = (page = 1) => http<TeamPage>(`/api/team?page=${page}&pageSize=100`);
export const teamQuery = (page = 1) =>
  queryOptions({ queryKey: teamKeys.list(page), queryFn: () => fetchTeam(page), placeholderData: keepPreviousData });
export const useTeam = (page = 1) => useQuery(teamQuery(page));

export const invite = (input: InviteInput) =>
  http<InvitationResponse>('/api/invitations', { method: 'POST', json: input });
export const updateMember = (id: number, input: TeamPatchInput) =>
  http<{ member: TeamMember }>(`/api/team/${id}`, { method: 'PATCH', json: input });

export function useInvite() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: invite, onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.all }) });
}

export function useUpdateMember() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: TeamPatchInput & { id: number }) => updateMember(id, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.all }),
  });
}

export const fetchPendingInvitations = () => http<{ items: PendingInvitation[] }>('/api/team/invitations');
export const pendingInvitationsQuery = () =>
  queryOptions({ queryKey: teamKeys.invitations, queryFn: fetchPendingInvitations });
export const usePendingInvitations = () => useQuery(pendingInvitationsQuery());

export const resendInvitation = (id: number) =>
  http<{ invitation: PendingInvitation }>(`/api/team/invitations/${id}/resend`, { method: 'POST' });
export const revokeInvitation = (id: number) => http<void>(`/api/team/invitations/${id}`, { method: 'DELETE' });

export function useResendInvitation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: resendInvitation,
    onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.invitations }),
  });
}

export function useRevokeInvitation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: revokeInvitation,
    onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.invitations }),
  });
}
