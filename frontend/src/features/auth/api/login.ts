import { useMutation } from '@tanstack/react-query';
import type { LoginRequest, SessionResponse } from '@loambook/common';
import { api } from '@/lib/api-client';

export function login(input: LoginRequest): Promise<SessionResponse> {
  return api.post<SessionResponse>('/auth/login', input);
}

export function useLogin() {
  return useMutation({ mutationFn: login });
}
