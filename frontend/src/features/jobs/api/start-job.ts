import { useMutation } from '@tanstack/react-query';
import type { JobDetail } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobPath, useJobChanged } from './job-cache';

export function startJob(id: string): Promise<JobDetail> {
  return api.post<JobDetail>(jobPath(id, '/start'));
}

export function useStartJob() {
  const changed = useJobChanged();
  return useMutation({ mutationFn: startJob, onSuccess: changed });
}
