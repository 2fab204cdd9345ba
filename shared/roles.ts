export const ROLES = ['admin', 'curator', 'researcher', 'dyer'] as const;
export type Role = (typeof ROLES)[number];
