import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Branch, BranchInput } from '@loambook/common';
import { api } from '@/lib/api-client';

export function createBranch(input: BranchInput): Promise<Branch> {
  return api.post<Branch>('/branches', input);
}

export function useCreateBranch() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createBranch,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: ['branches'] });
    },
  });
}
