import { ROLES, type Role } from '@shared/model/permissions';

export const ROLE_LABELS: Record<Role, string> = {
  designer: 'Designer',
  checker: 'Checker',
  fabricator: 'Fabricator',
  lead: 'Lead',
  admin: 'Team admin',
};

export const ROLE_OPTIONS = ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }));

export const roleLabel = (r: string) => ROLE_LABELS[r as Role] ?? r;
