import type { AuthToken } from '../models/index.ts';
import type { Invitation } from '../../shared/schemas/invitations.ts';
import type { PendingInvitation } from '../../shared/schemas/team.ts';
import type { Role } from '../../shared/roles.ts';

// An invitation's token always carries the role offered (server/services/invitations.ts); only reset tokens have none.
const offeredRole = (t: AuthToken) => t.role as Role;

export const presentInvitation = (t: AuthToken): Invitation => ({
  email: t.email,
  role: offeredRole(t),
  expiresAt: t.expiresAt.toISOString(),
});

/** For admins: the invitation's id (to resend or withdraw), who sent it and whether its link has expired. */
export const presentPendingInvitation = ({
  record: t,
  invitedBy,
}: {
  record: AuthToken;
  invitedBy: string | null;
}): PendingInvitation => ({
  id: t.id,
  email: t.email,
  role: offeredRole(t),
  sentAt: t.createdAt.toISOString(),
  expiresAt: t.expiresAt.toISOString(),
  expired: t.expiresAt.getTime() <= Date.now(),
  invitedBy,
});
