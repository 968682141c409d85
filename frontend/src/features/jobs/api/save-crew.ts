import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Crew, CrewInput } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys } from './job-cache';

export function createCrew(input: CrewInput): Promise<Crew> {
  return api.post<Crew>('/crews', input);
}

export function updateCrew({ id, patch }: { id: string; patch: Partial<CrewInput> }): Promise<Crew> {
  return api.patch<Crew>(`/crews/${encodeURIComponent(id)}`, patch);
}

function useCrewsChanged() {
  const queryClient = useQueryClient();
  return async () => {
    await Promise.all([
      queryClient.invalidateQueries({ queryKey: jobKeys.crews }),
      queryClient.invalidateQueries({ queryKey: jobKeys.calendar }),
    ]);
  };
}

export function useCreateCrew() {
  const changed = useCrewsChanged();
  return useMutation({ mutationFn: createCrew, onSuccess: changed });
}

export function useUpdateCrew() {
  const changed = useCrewsChanged();
  return useMutation({ mutationFn: updateCrew, onSuccess: changed });
}
