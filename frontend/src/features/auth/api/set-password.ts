import { useMutation } from '@tanstack/react-query';
import type { SessionResponse, SetPasswordRequest } from '@loambook/common';
import { api } from '@/lib/api-client';

export function setPassword(input: SetPasswordRequest): Promise<SessionResponse> {
  return api.post<SessionResponse>('/auth/password', input);
}

export function useSetPassword() {
  return useMutation({ mutationFn: setPassword });
}
