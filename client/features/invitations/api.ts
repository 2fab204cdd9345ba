import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AcceptInvitationInput } from '../../../shared/schemas/team';
import type { AcceptedResponse, InvitationResponse } from '../../../shared/schemas/invitations';
import { http } from '../../lib/http';
import { authKeys, fetchMe, forgetOtherQueries } from '../auth';

export const invitationKeys = { one: (token: string) => ['invitations', token] as const };

export const fetchInvitation = (token: string) =>
  http<InvitationResponse>(`/api/invitations/${encodeURIComponent(token)}`);
export const invitationQuery = (token: string) =>
  queryOptions({ queryKey: invitationKeys.one(token), queryFn: () => fetchInvitation(token), retry: false });
export const useInvitation = (token: string) => useQuery(invitationQuery(token));

export const acceptInvitation = (token: string, input: AcceptInvitationInput) =>
  http<AcceptedResponse>(`/api/invitations/${encodeURIComponent(token)}/accept`, { method: 'POST', json: input });

/** Accepting signs the new member in; the whole cache is theirs from then on. */
export function useAcceptInvitation(token: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: AcceptInvitationInput) => acceptInvitation(token, input),
    onSuccess: async () => {
      forgetOtherQueries(qc);
      qc.setQueryData(authKeys.me, await fetchMe());
    },
  });
}
