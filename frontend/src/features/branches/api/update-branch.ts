import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Branch, BranchInput } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface UpdateBranchVariables {
  id: string;
  patch: Partial<BranchInput>;
}

export function updateBranch({ id, patch }: UpdateBranchVariables): Promise<Branch> {
  return api.patch<Branch>(`/branches/${encodeURIComponent(id)}`, patch);
}

export function useUpdateBranch() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateBranch,
    onSuccess: async (branch) => {
      queryClient.setQueryData(['branches', 'detail', branch.id], branch);
      await queryClient.invalidateQueries({ queryKey: ['branches'] });
    },
  });
}
