import { useMutation } from '@tanstack/react-query';
import type { JobDetail, PermitInput } from '@loambook/common';
import { apiRequest } from '@/lib/api-client';
import { jobPath, useJobChanged } from './job-cache';

export function savePermit({ id, input }: { id: string; input: PermitInput }): Promise<JobDetail> {
  return apiRequest<JobDetail>(jobPath(id, '/permit'), { method: 'PUT', body: input });
}

export function useSavePermit() {
  const changed = useJobChanged();
  return useMutation({ mutationFn: savePermit, onSuccess: changed });
}
