import { useMutation } from '@tanstack/react-query';
import type { CompleteJobInput, JobDetail } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobPath, useJobChanged } from './job-cache';

export function completeJob({ id, input }: { id: string; input: CompleteJobInput }): Promise<JobDetail> {
  return api.post<JobDetail>(jobPath(id, '/complete'), input);
}

export function useCompleteJob() {
  const changed = useJobChanged();
  return useMutation({ mutationFn: completeJob, onSuccess: changed });
}
