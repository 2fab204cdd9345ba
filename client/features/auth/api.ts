import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Abilities } from '../../../shared/abilities';
import type { LoginInput, ResetLink, Session } from '../../../shared/schemas/auth';
import type { ResetPasswordInput, ResetRequestInput } from '../../../shared/schemas/team';
import { ApiError, http } from '../../lib/http';

export type Me = Session | null;

export const authKeys = { me: ['auth', 'me'] as const };

/** The signed-in user with their abilities, or null for a visitor. */
export async function fetchMe(): Promise<Me> {
  try {
    return await http<Session>('/api/auth/me');
  } catch (e) {
    if (e instanceof ApiError && e.status === 401) return null;
    throw e;
  }
}
export const meQuery = () => queryOptions({ queryKey: authKeys.me, queryFn: fetchMe, staleTime: 5 * 60_000 });
export const useMe = () => useQuery(meQuery());

/** True when the signed-in user (or visitor) may take the action; abilities come from the server. */
export function useCan() {
  const me = useMe().data;
  return (action: keyof Abilities) => Boolean(me?.abilities[action]);
}

export const login = (input: LoginInput) => http<Session>('/api/auth/login', { method: 'POST', json: input });
export const logout = () => http<void>('/api/auth/logout', { method: 'POST' });

/**
 * A new session sees other records: drop every cached answer but the session's own. The session
 * query itself is kept, not cleared, so the components already showing it (the header and its
 * menu, which stay mounted across pages) are told of the change instead of holding the old one.
 */
export function forgetOtherQueries(qc: ReturnType<typeof useQueryClient>) {
  qc.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.me[0] });
}

export function useLogin() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (me) => {
      forgetOtherQueries(qc);
      qc.setQueryData(authKeys.me, me);
    },
  });
}

export function useLogout() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onSuccess: () => {
      forgetOtherQueries(qc);
      qc.setQueryData(authKeys.me, null);
    },
  });
}

export const requestPasswordReset = (input: ResetRequestInput) =>
  http<{ message: string }>('/api/auth/password-reset', { method: 'POST', json: input });
export const resetPassword = (token: string, input: ResetPasswordInput) =>
  http<void>(`/api/auth/password-reset/${encodeURIComponent(token)}`, { method: 'POST', json: input });

export const useRequestPasswordReset = () => useMutation({ mutationFn: requestPasswordReset });
export const fetchResetLink = (token: string) =>
  http<ResetLink>(`/api/auth/password-reset/${encodeURIComponent(token)}`);
/** The link is checked when the page opens, so a used or expired one says so before anyone types. */
export const useResetLink = (token: string) =>
  useQuery({
    queryKey: ['password-reset', token],
    queryFn: () => fetchResetLink(token),
    retry: false,
    staleTime: Infinity,
  });
export const useResetPassword = (token: string) =>
  useMutation({ mutationFn: (input: ResetPasswordInput) => resetPassword(token, input) });
