import { useMutation } from '@tanstack/react-query';
import type { JobDetail, LocateInput } from '@loambook/common';
import { apiRequest } from '@/lib/api-client';
import { jobPath, useJobChanged } from './job-cache';

export function saveLocate({ id, input }: { id: string; input: LocateInput }): Promise<JobDetail> {
  return apiRequest<JobDetail>(jobPath(id, '/locate'), { method: 'PUT', body: input });
}

export function useSaveLocate() {
  const changed = useJobChanged();
  return useMutation({ mutationFn: saveLocate, onSuccess: changed });
}
