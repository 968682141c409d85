import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UserSummary } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface UsersFilter {
  /** One branch's people, or everyone the signed-in person may see (null). */
  branchId: string | null;
}

export function getUsers(filter: UsersFilter, signal?: AbortSignal): Promise<UserSummary[]> {
  return api.get<UserSummary[]>('/users', { query: { branchId: filter.branchId }, signal });
}

export const usersQueryOptions = (filter: UsersFilter) =>
  queryOptions({
    queryKey: ['users', 'list', filter],
    queryFn: ({ signal }) => getUsers(filter, signal),
  });

export function useUsers(filter: UsersFilter) {
  return useQuery(usersQueryOptions(filter));
}
