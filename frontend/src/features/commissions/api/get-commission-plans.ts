import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CommissionPlanView } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getCommissionPlans(signal?: AbortSignal): Promise<CommissionPlanView[]> {
  return api.get<CommissionPlanView[]>('/commission-plans', { signal });
}

export const commissionPlansQueryOptions = () =>
  queryOptions({
    queryKey: ['commissions', 'plans', 'list'],
    queryFn: ({ signal }) => getCommissionPlans(signal),
  });

export function useCommissionPlans() {
  return useQuery(commissionPlansQueryOptions());
}
