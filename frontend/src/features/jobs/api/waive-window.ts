import { useMutation } from '@tanstack/react-query';
import type { JobDetail, WaiveWindowInput } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobPath, useJobChanged } from './job-cache';

export function waiveWindow({ id, input }: { id: string; input: WaiveWindowInput }): Promise<JobDetail> {
  return api.post<JobDetail>(jobPath(id, '/waive-window'), input);
}

export function useWaiveWindow() {
  const changed = useJobChanged();
  return useMutation({ mutationFn: waiveWindow, onSuccess: changed });
}
