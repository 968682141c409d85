import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UserSummary } from '@loambook/common';
import { api } from '@/lib/api-client';

/** Sends a fresh invitation link to someone who has not set a password yet. */
export function resendInvitation(id: string): Promise<UserSummary> {
  return api.post<UserSummary>(`/users/${encodeURIComponent(id)}/invitation`);
}

export function useResendInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resendInvitation,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: ['users'] });
    },
  });
}
