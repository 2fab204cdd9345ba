import { z } from 'zod';
import '../messages.ts';
import { ROLES } from '../roles.ts';
import { email, newPassword } from './auth.ts';

// Tokens are 32 random bytes in base64url: 43 characters.
export const tokenParams = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'That link is not valid.') });
export const idParams = z.object({ id: z.coerce.number().int().positive() });

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
  .refine((v) => v.role !== undefined || v.active !== undefined, { message: 'Change the role or the active flag', path: ['role'] });
export type TeamPatchInput = z.infer<typeof teamPatchSchema>;

export const teamQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

export const teamMemberSchema = z.object({
  id: z.number(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  active: z.boolean(),
  createdAt: z.string(),
});
export type TeamMember = z.infer<typeof teamMemberSchema>;

/** How long a link stays valid. Invitations: 7 days; resets: 2 hours (a reset link grants an existing account). */
export const TOKEN_TTL_MS = { invitation: 7 * 24 * 3600_000, 'password-reset': 2 * 3600_000 } as const;
