import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { BankAccount, CreateBankAccountRequest } from './types';

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
