import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Only a branch nothing refers to can go; otherwise the server answers 409 BRANCH.IN_USE. */
export function deleteBranch(id: string): Promise<void> {
  return api.delete(`/branches/${encodeURIComponent(id)}`);
}

export function useDeleteBranch() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteBranch,
    onSuccess: async (_result, id) => {
      queryClient.removeQueries({ queryKey: ['branches', 'detail', id] });
      await queryClient.invalidateQueries({ queryKey: ['branches'] });
    },
  });
}
