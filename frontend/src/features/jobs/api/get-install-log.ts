import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InstallLogResponse } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys, jobPath } from './job-cache';

export function getInstallLog(id: string, signal?: AbortSignal): Promise<InstallLogResponse> {
  return api.get<InstallLogResponse>(jobPath(id, '/log'), { signal });
}

export const installLogQueryOptions = (id: string) =>
  queryOptions({ queryKey: jobKeys.log(id), queryFn: ({ signal }) => getInstallLog(id, signal) });

export function useInstallLog(id: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...installLogQueryOptions(id), enabled: options.enabled ?? true });
}
