import { z } from 'zod';
import '../messages.ts';
import { ROLES } from '../roles.ts';

export const email = z.string().trim().toLowerCase().email('Enter an e-mail address such as name@example.org').max(254);
export const newPassword = z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters');

export const loginSchema = z.object({ email, password: z.string().min(1, 'Enter your password').max(200) });
export type LoginInput = z.infer<typeof loginSchema>;

export const userSchema = z.object({ id: z.number(), email: z.string(), name: z.string(), role: z.enum(ROLES) });
export type SessionUser = z.infer<typeof userSchema>;
