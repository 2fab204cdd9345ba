import type { User } from '../models/index.ts';
import type { SessionUser } from '../../shared/schemas/auth.ts';
import type { TeamMember } from '../../shared/schemas/team.ts';

export const presentUser = (u: User): SessionUser => ({ id: u.id, email: u.email, name: u.name, role: u.role });
export const presentTeamMember = (u: User): TeamMember => ({
  ...presentUser(u),
  active: u.active,
  createdAt: u.createdAt.toISOString(),
});
