import {
  asSubject,
  ROLE_LABELS,
  ROLES,
  type AppAbility,
  type Role,
  type UserSummary,
} from '@loambook/common';
import type { FieldErrors } from '@/lib/form-errors';

/** Roles that work inside branches and so need at least one (the server checks the same). */
export const BRANCH_ROLES: readonly Role[] = ['branch_manager', 'salesperson', 'crew_lead'];

export const needsBranch = (role: Role | null | undefined) => !!role && BRANCH_ROLES.includes(role);

/** The roles this person may give someone new: every role for an owner, some for a branch manager. */
export function invitableRoles(ability: AppAbility, branchIds: string[] = []): Role[] {
  return ROLES.filter((role) => ability.can('create', asSubject('User', { id: '', role, branchIds })));
}

/** The roles this person may move `target` to (their current role always stays in the list). */
export function assignableRoles(ability: AppAbility, target: UserSummary): Role[] {
  return ROLES.filter(
    (role) =>
      role === target.role ||
      ability.can('update', asSubject('User', { id: target.id, role, branchIds: target.branchIds })),
  );
}

export function canChange(ability: AppAbility, user: UserSummary): boolean {
  return ability.can(
    'update',
    asSubject('User', { id: user.id, role: user.role, branchIds: user.branchIds }),
  );
}

export type UserStatus = 'active' | 'pending' | 'deactivated';

export function statusOf(user: UserSummary): UserStatus {
  if (!user.active) return 'deactivated';
  return user.invitationPending ? 'pending' : 'active';
}

export const STATUS_LABELS: Record<UserStatus, string> = {
  active: 'Active',
  pending: 'Invitation pending',
  deactivated: 'Deactivated',
};

export const roleOptions = (roles: readonly Role[]) =>
  roles.map((r) => ({ label: ROLE_LABELS[r], value: r }));

export type PersonField = 'name' | 'email' | 'role' | 'branchIds';

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

/** The checks the server makes (backend/src/users/dto/user.dto.ts and the branch rule in the service). */
export function validatePerson(
  values: { name: string; email?: string; role: Role | null; branchIds: string[] },
  { checkEmail }: { checkEmail: boolean },
): FieldErrors<PersonField> {
  const errors: FieldErrors<PersonField> = {};
  const name = values.name.trim();
  if (name.length < 2) errors.name = 'Enter the person’s name.';
  else if (name.length > 100) errors.name = 'Use at most 100 characters.';
  if (checkEmail) {
    const email = (values.email ?? '').trim();
    if (!email) errors.email = 'Enter their e-mail address.';
    else if (!EMAIL.test(email) || email.length > 254) errors.email = 'Enter a valid e-mail address.';
  }
  if (!values.role) errors.role = 'Choose a role.';
  else if (needsBranch(values.role) && values.branchIds.length === 0) {
    errors.branchIds = `A ${ROLE_LABELS[values.role].toLowerCase()} needs at least one branch.`;
  }
  return errors;
}
