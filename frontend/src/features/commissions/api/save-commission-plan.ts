import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CommissionPlanInput, CommissionPlanPatch, CommissionPlanView } from '@loambook/common';
import { api } from '@/lib/api-client';

export function createCommissionPlan(input: CommissionPlanInput): Promise<CommissionPlanView> {
  return api.post<CommissionPlanView>('/commission-plans', input);
}

export function updateCommissionPlan(id: string, patch: CommissionPlanPatch): Promise<CommissionPlanView> {
  return api.patch<CommissionPlanView>(`/commission-plans/${encodeURIComponent(id)}`, patch);
}

/** Creates a plan (no id) or changes one; the plan list and every split preview are asked for again. */
export function useSaveCommissionPlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string | null; input: CommissionPlanInput }) =>
      id ? updateCommissionPlan(id, input) : createCommissionPlan(input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['commissions'] }),
  });
}
