import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateLeadResponse, LeadInput } from '@loambook/common';
import { api } from '@/lib/api-client';

export function createLead(input: LeadInput): Promise<CreateLeadResponse> {
  return api.post<CreateLeadResponse>('/leads', input);
}

export function useCreateLead() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createLead,
    onSuccess: async (result) => {
      queryClient.setQueryData(['leads', 'detail', result.lead.id], result.lead);
      await queryClient.invalidateQueries({ queryKey: ['leads', 'list'] });
    },
  });
}
