import { z } from 'zod';
import '../messages.ts';
import { ROLES } from '../roles.ts';
import { ACTIONS } from '../abilities.ts';

export const email = z.string().trim().toLowerCase().email('Enter an e-mail address such as name@example.org').max(254);
export const newPassword = z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters');

export const loginSchema = z.object({ email, password: z.string().min(1, 'Enter your password').max(200) });
export type LoginInput = z.infer<typeof loginSchema>;

export const userSchema = z.object({ id: z.number(), email: z.string(), name: z.string(), role: z.enum(ROLES) });
export type SessionUser = z.infer<typeof userSchema>;

// Answers of /api/auth (presenters in server/presenters/user.ts and the auth router are typed by these).
/** Every action with the session's right to it (shared/abilities.ts). */
export const abilitiesSchema = z.record(z.enum(ACTIONS), z.boolean());
/** GET /api/auth/me and POST /api/auth/login. */
export const sessionSchema = z.object({ user: userSchema, abilities: abilitiesSchema });
export type Session = z.infer<typeof sessionSchema>;
/** POST /api/auth/password-reset: the same words whatever the address. */
export const resetRequestedSchema = z.object({ message: z.string() });
/** GET /api/auth/password-reset/:token: the link is live until then. */
export const resetLinkSchema = z.object({ expiresAt: z.iso.datetime() });
export type ResetLink = z.infer<typeof resetLinkSchema>;
