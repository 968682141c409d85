import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignContractRequest, SigningView } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface SignContractVariables {
  token: string;
  input: SignContractRequest;
}

/** Signs one option; the answer is the page again, now with the contract and its last day to cancel. */
export function signContract({ token, input }: SignContractVariables): Promise<SigningView> {
  return api.post<SigningView>(`/signing/${encodeURIComponent(token)}/sign`, input);
}

export function useSignContract() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signContract,
    onSuccess: (view, { token }) => {
      queryClient.setQueryData(['signing', token], view);
    },
  });
}
