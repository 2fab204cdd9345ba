import { z } from 'zod';
import '../messages.ts';
import { ROLES } from '../roles.ts';
import { email, newPassword, userSchema } from './auth.ts';
import { pageQuery, paged } from './common.ts';

// Tokens are 32 random bytes in base64url: 43 characters.
export const tokenParams = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'That link is not valid.') });

export const inviteSchema = z.object({ email, role: z.enum(ROLES, 'Choose a role') });
export type InviteInput = z.infer<typeof inviteSchema>;

export const acceptInvitationSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name').max(120, 'Use at most 120 characters'),
  password: newPassword,
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;

export const resetRequestSchema = z.object({ email });
export type ResetRequestInput = z.infer<typeof resetRequestSchema>;
export const resetPasswordSchema = z.object({ password: newPassword });
export type ResetPasswordInput = z.infer<typeof resetPasswordSchema>;

export const teamPatchSchema = z
  .object({ role: z.enum(ROLES).optional(), active: z.boolean().optional() })
  .refine((v) => v.role !== undefined || v.active !== undefined, {
    message: 'Change the role or the active flag',
    path: ['role'],
  });
export type TeamPatchInput = z.infer<typeof teamPatchSchema>;

/** The team list takes up to 200 a page (the team page asks for 100). */
export const teamQuerySchema = pageQuery(50, 200);

// Answers of /api/team (presenters in server/presenters/user.ts and invitation.ts).
export const teamMemberSchema = userSchema.extend({ active: z.boolean(), createdAt: z.iso.datetime() });
export type TeamMember = z.infer<typeof teamMemberSchema>;
/** GET /api/team. */
export const teamPageSchema = paged(teamMemberSchema);
export type TeamPage = z.infer<typeof teamPageSchema>;
/** PATCH /api/team/:id. */
export const memberResponse = z.object({ member: teamMemberSchema });

/** For admins: a pending invitation with its id (to resend or withdraw), who sent it and whether its link has expired. */
export const pendingInvitationSchema = z.object({
  id: z.number(),
  email: z.string(),
  role: z.enum(ROLES),
  sentAt: z.iso.datetime(),
  expiresAt: z.iso.datetime(),
  expired: z.boolean(),
  invitedBy: z.string().nullable(),
});
export type PendingInvitation = z.infer<typeof pendingInvitationSchema>;
/** GET /api/team/invitations (all pending, not paged). */
export const pendingInvitationListSchema = z.object({ items: z.array(pendingInvitationSchema) });
/** POST /api/team/invitations/:id/resend. */
export const pendingInvitationResponse = z.object({ invitation: pendingInvitationSchema });

/** How long a link stays valid. Invitations: 7 days; resets: 2 hours (a reset link grants an existing account). */
export const TOKEN_TTL_MS = { invitation: 7 * 24 * 3600_000, 'password-reset': 2 * 3600_000 } as const;
