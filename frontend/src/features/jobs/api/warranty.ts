import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Warranty, WarrantyInput } from '@loambook/common';
import { api, isApiError } from '@/lib/api-client';
import { jobKeys, jobPath } from './job-cache';

/** The job's warranty, or null while none has been issued (the API answers 404). */
export async function getWarranty(id: string, signal?: AbortSignal): Promise<Warranty | null> {
  try {
    return await api.get<Warranty>(jobPath(id, '/warranty'), { signal });
  } catch (error) {
    if (isApiError(error) && error.status === 404) return null;
    throw error;
  }
}

export const warrantyQueryOptions = (id: string) =>
  queryOptions({ queryKey: jobKeys.warranty(id), queryFn: ({ signal }) => getWarranty(id, signal) });

export function useWarranty(id: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...warrantyQueryOptions(id), enabled: options.enabled ?? true });
}

export function issueWarranty({ id, input }: { id: string; input: WarrantyInput }): Promise<Warranty> {
  return api.post<Warranty>(jobPath(id, '/warranty'), input);
}

export function useIssueWarranty() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: issueWarranty,
    onSuccess: (w) => {
      queryClient.setQueryData(jobKeys.warranty(w.jobId), w);
    },
  });
}

export const certificatePath = (id: string) => jobPath(id, '/warranty/certificate.pdf');
