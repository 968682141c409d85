import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InviteUserRequest, UserSummary } from '@loambook/common';
import { api } from '@/lib/api-client';

/** Creates the account and e-mails the person a link to choose a password. */
export function inviteUser(input: InviteUserRequest): Promise<UserSummary> {
  return api.post<UserSummary>('/users', input);
}

export function useInviteUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: inviteUser,
    onSuccess: async () => {
      // People counts on branches change too.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['users'] }),
        queryClient.invalidateQueries({ queryKey: ['branches'] }),
      ]);
    },
  });
}
