/** The five kinds of people who use Loambook. Stored as text in users.role (a CHECK constraint lists them). */
export const ROLES = ['owner', 'branch_manager', 'salesperson', 'bookkeeper', 'crew_lead'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  branch_manager: 'Branch manager',
  salesperson: 'Salesperson',
  bookkeeper: 'Bookkeeper',
  crew_lead: 'Crew lead',
};

/** Roles a branch manager may invite into their own branches. The owner may invite any role. */
export const ROLES_A_MANAGER_MAY_INVITE: readonly Role[] = ['salesperson', 'crew_lead'];

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}
