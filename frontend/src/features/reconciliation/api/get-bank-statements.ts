import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BankStatement, BankStatementLine } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getBankStatements(
  bankAccountId: string | null,
  signal?: AbortSignal,
): Promise<BankStatement[]> {
  return api.get<BankStatement[]>('/bank-statements', { query: { bankAccountId }, signal });
}

export const bankStatementsQueryOptions = (bankAccountId: string | null) =>
  queryOptions({
    queryKey: ['reconciliation', 'statements', { bankAccountId }],
    queryFn: ({ signal }) => getBankStatements(bankAccountId, signal),
  });

export function useBankStatements(bankAccountId: string | null) {
  return useQuery(bankStatementsQueryOptions(bankAccountId));
}

export function getStatementLines(statementId: string, signal?: AbortSignal): Promise<BankStatementLine[]> {
  return api.get<BankStatementLine[]>(`/bank-statements/${encodeURIComponent(statementId)}/lines`, {
    signal,
  });
}

export const statementLinesQueryOptions = (statementId: string) =>
  queryOptions({
    queryKey: ['reconciliation', 'statement-lines', statementId],
    queryFn: ({ signal }) => getStatementLines(statementId, signal),
  });

export function useStatementLines(statementId: string | null) {
  return useQuery({ ...statementLinesQueryOptions(statementId ?? ''), enabled: statementId !== null });
}
