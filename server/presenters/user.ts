import type { User } from '../models/index.ts';

export const presentUser = (u: User) => ({ id: u.id, email: u.email, name: u.name, role: u.role });
export const presentTeamMember = (u: User) => ({ ...presentUser(u), active: u.active, createdAt: u.createdAt.toISOString() });
