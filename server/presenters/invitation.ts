import type { AuthToken } from '../models/index.ts';

export const presentInvitation = (t: AuthToken) => ({ email: t.email, role: t.role, expiresAt: t.expiresAt.toISOString() });

/** For admins: the invitation's id (to resend or withdraw), who sent it and whether its link has expired. */
export const presentPendingInvitation = ({ record: t, invitedBy }: { record: AuthToken; invitedBy: string | null }) => ({
  id: t.id,
  email: t.email,
  role: t.role,
  sentAt: t.createdAt.toISOString(),
  expiresAt: t.expiresAt.toISOString(),
  expired: t.expiresAt.getTime() <= Date.now(),
  invitedBy,
});
