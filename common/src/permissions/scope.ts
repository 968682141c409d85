import type { AbilityUser } from './abilities';

/**
 * Which branches a list query may return rows of, for a given kind of record. `null` means every branch.
 * Lists are filtered in SQL with this; the CASL rules stay the reference and the tests check both agree.
 */
export type RecordFamily = 'sales' | 'money' | 'admin';

export function branchScope(user: AbilityUser, family: RecordFamily): string[] | null {
  if (user.role === 'owner') return null;
  if (user.role === 'bookkeeper' && (family === 'money' || family === 'sales')) return null;
  return user.branchIds;
}
