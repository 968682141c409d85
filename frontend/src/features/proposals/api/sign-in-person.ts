import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ContractView, SignInPersonRequest } from '@loambook/common';
import { api } from '@/lib/api-client';
import { invalidateSelling } from './invalidate';

export interface SignInPersonVariables {
  id: string;
  input: SignInPersonRequest;
}

/** The homeowner signs on the salesperson's device: the same contract as online. */
export function signInPerson({ id, input }: SignInPersonVariables): Promise<ContractView> {
  return api.post<ContractView>(`/proposals/${encodeURIComponent(id)}/sign-in-person`, input);
}

export function useSignInPerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signInPerson,
    onSuccess: async (contract) => {
      queryClient.setQueryData(['contracts', 'lead', contract.leadId], contract);
      await invalidateSelling(queryClient);
    },
  });
}
