import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ContractCommissionSplitsView, SetCommissionSplitsInput } from '@loambook/common';
import { apiRequest } from '@/lib/api-client';

export function setContractSplits(
  contractId: string,
  input: SetCommissionSplitsInput,
): Promise<ContractCommissionSplitsView> {
  return apiRequest<ContractCommissionSplitsView>(
    `/contracts/${encodeURIComponent(contractId)}/commission-splits`,
    { method: 'PUT', body: input },
  );
}

export function useSetContractSplits(contractId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SetCommissionSplitsInput) => setContractSplits(contractId, input),
    onSuccess: async (view) => {
      queryClient.setQueryData(['commissions', 'splits', contractId], view);
      await queryClient.invalidateQueries({ queryKey: ['commissions', 'splits', contractId] });
    },
  });
}
