import { useMutation } from '@tanstack/react-query';
import type { CancelSigningResponse } from '@loambook/common';
import { api } from '@/lib/api-client';

/** The homeowner cancels, through the end of the last day to cancel (branch time). */
export function cancelSignedContract(token: string): Promise<CancelSigningResponse> {
  return api.post<CancelSigningResponse>(`/signing/${encodeURIComponent(token)}/cancel`, { confirm: true });
}

export function useCancelSignedContract() {
  return useMutation({ mutationFn: cancelSignedContract });
}
