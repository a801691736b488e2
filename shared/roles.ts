// Roles from lowest to highest. A manager has every senior right plus users and shop settings.
export const roles = ['apprentice', 'technician', 'senior', 'manager'] as const;
export type Role = (typeof roles)[number];

export const caseStatuses = ['draft', 'review', 'published'] as const;
export type CaseStatus = (typeof caseStatuses)[number];

export function roleRank(role: Role): number {
  return roles.indexOf(role);
}

export function atLeast(role: Role, minimum: Role): boolean {
  return roleRank(role) >= roleRank(minimum);
}

export const roleLabels: Record<Role, string> = {
  apprentice: 'Apprentice',
  technician: 'Technician',
  senior: 'Senior tech',
  manager: 'Manager',
};
