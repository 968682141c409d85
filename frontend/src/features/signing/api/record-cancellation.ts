import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CancelContractRequest, ContractView } from '@loambook/common';
import { api } from '@/lib/api-client';

/** Staff record a cancellation the homeowner made by phone, mail or in person (inside the window). */
export function recordCancellation({
  contractId,
  note,
}: { contractId: string } & CancelContractRequest): Promise<ContractView> {
  return api.post<ContractView>(`/contracts/${encodeURIComponent(contractId)}/cancel`, { note });
}

export function useRecordCancellation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordCancellation,
    // The contract, the lead (now cancelled, with a timeline entry) and the lists all change.
    onSuccess: async (contract) => {
      queryClient.setQueryData(['contracts', 'lead', contract.leadId], contract);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['contracts'] }),
        queryClient.invalidateQueries({ queryKey: ['leads'] }),
        queryClient.invalidateQueries({ queryKey: ['proposals'] }),
      ]);
    },
  });
}
