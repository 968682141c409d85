import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BankAccount, CreateBankAccountRequest } from '@loambook/common';
import { api } from '@/lib/api-client';

export function createBankAccount(body: CreateBankAccountRequest): Promise<BankAccount> {
  return api.post<BankAccount>('/bank-accounts', body);
}

export function useCreateBankAccount() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createBankAccount,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['reconciliation', 'bank-accounts'] }),
  });
}
