import { ROLES, type Role } from '../../../shared/roles';

export const roleLabel: Record<Role, string> = {
  admin: 'Admin',
  curator: 'Curator',
  researcher: 'Researcher',
  dyer: 'Dyer',
};
export const roleOptions = ROLES.map((r) => ({ value: r, label: roleLabel[r] }));
