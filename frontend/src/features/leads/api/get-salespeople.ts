import { useQuery } from '@tanstack/react-query';
import type { UserSummary } from '@loambook/common';
import { usersQueryOptions } from '@/features/users/api/get-users';

/** Who can take a lead in a branch: active salespeople and managers (the server's rule). */
export const SELLING_ROLES = ['salesperson', 'branch_manager'] as const;

export function sellsIn(user: UserSummary, branchId: string | null): boolean {
  return (
    user.active &&
    (SELLING_ROLES as readonly string[]).includes(user.role) &&
    (branchId === null || user.branchIds.includes(branchId))
  );
}

/** The people who sell in a branch (or in every branch the person sees, for null), by name. */
export function useSalespeople(branchId: string | null, options: { enabled: boolean }) {
  return useQuery({
    ...usersQueryOptions({ branchId }),
    enabled: options.enabled,
    select: (users) => users.filter((u) => sellsIn(u, branchId)).sort((a, b) => a.name.localeCompare(b.name)),
  });
}
