import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateUserRequest, UserSummary } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface UpdateUserVariables {
  id: string;
  patch: UpdateUserRequest;
}

/** Name, role, branches, or `active: false` to deactivate (the person is signed out). */
export function updateUser({ id, patch }: UpdateUserVariables): Promise<UserSummary> {
  return api.patch<UserSummary>(`/users/${encodeURIComponent(id)}`, patch);
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['users'] }),
        queryClient.invalidateQueries({ queryKey: ['branches'] }),
      ]);
    },
  });
}
