import { useMutation } from '@tanstack/react-query';
import type { JobDetail, ScheduleJobInput } from '@loambook/common';
import { apiRequest } from '@/lib/api-client';
import { jobPath, useJobChanged } from './job-cache';

export function scheduleJob({ id, input }: { id: string; input: ScheduleJobInput }): Promise<JobDetail> {
  return apiRequest<JobDetail>(jobPath(id, '/schedule'), { method: 'PUT', body: input });
}

export function unscheduleJob(id: string): Promise<JobDetail> {
  return apiRequest<JobDetail>(jobPath(id, '/schedule'), { method: 'DELETE' });
}

export function useScheduleJob() {
  const changed = useJobChanged();
  return useMutation({ mutationFn: scheduleJob, onSuccess: changed });
}

export function useUnscheduleJob() {
  const changed = useJobChanged();
  return useMutation({ mutationFn: unscheduleJob, onSuccess: changed });
}
