import type { AuthToken } from '../models/index.ts';

export const presentInvitation = (t: AuthToken) => ({ email: t.email, role: t.role, expiresAt: t.expiresAt.toISOString() });
