import { z } from 'zod';
import '../messages.ts';
import { ROLES } from '../roles.ts';
import { userSchema } from './auth.ts';

// Request schemas of /api/invitations (inviteSchema, acceptInvitationSchema, tokenParams) are in ./team.ts.

/** An invitation as its link shows it: the address, the role and until when the link works (server/presenters/invitation.ts). */
export const invitationSchema = z.object({ email: z.string(), role: z.enum(ROLES), expiresAt: z.iso.datetime() });
export type Invitation = z.infer<typeof invitationSchema>;
/** POST /api/invitations (201) and GET /api/invitations/:token. */
export const invitationResponse = z.object({ invitation: invitationSchema });
export type InvitationResponse = z.infer<typeof invitationResponse>;
/** POST /api/invitations/:token/accept (201): the new member, signed in. */
export const acceptedResponse = z.object({ user: userSchema });
export type AcceptedResponse = z.infer<typeof acceptedResponse>;
