import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  BuildStatementsResult,
  CommissionStatementDetail,
  EarningRunResult,
  PayStatementInput,
} from '@loambook/common';
import { api, apiRequest } from '@/lib/api-client';

export function approveStatement(id: string): Promise<CommissionStatementDetail> {
  return api.post<CommissionStatementDetail>(`/commission-statements/${encodeURIComponent(id)}/approve`, {});
}

export function payStatement(id: string, input: PayStatementInput): Promise<CommissionStatementDetail> {
  return api.post<CommissionStatementDetail>(`/commission-statements/${encodeURIComponent(id)}/pay`, input);
}

export function buildStatements(period: string): Promise<BuildStatementsResult> {
  return apiRequest<BuildStatementsResult>('/commission-statements/build', {
    method: 'POST',
    body: {},
    query: { period },
  });
}

export function runEarningCheck(): Promise<EarningRunResult> {
  return api.post<EarningRunResult>('/commissions/run', {});
}

/** Statements and the ledger change together: both are asked for again before a mutation settles. */
function useInvalidateMoney() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: ['commissions'] }),
      queryClient.invalidateQueries({ queryKey: ['ledger'] }),
    ]);
}

export function useApproveStatement() {
  const invalidate = useInvalidateMoney();
  return useMutation({ mutationFn: approveStatement, onSuccess: invalidate });
}

export function usePayStatement() {
  const invalidate = useInvalidateMoney();
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: PayStatementInput }) => payStatement(id, input),
    onSuccess: invalidate,
  });
}

export function useBuildStatements() {
  const invalidate = useInvalidateMoney();
  return useMutation({ mutationFn: buildStatements, onSuccess: invalidate });
}

export function useRunEarningCheck() {
  const invalidate = useInvalidateMoney();
  return useMutation({ mutationFn: runEarningCheck, onSuccess: invalidate });
}
