import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PutSurveyRequest, Survey, SurveyKind } from '@loambook/common';
import { apiRequest } from '@/lib/api-client';

export function saveSurvey({
  id,
  kind,
  request,
}: {
  id: string;
  kind: SurveyKind;
  request: PutSurveyRequest;
}): Promise<Survey> {
  return apiRequest<Survey>(`/inspections/${encodeURIComponent(id)}/survey`, {
    method: 'PUT',
    query: { kind },
    body: request,
  });
}

export function useSaveSurvey() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveSurvey,
    onSuccess: async (survey) => {
      queryClient.setQueryData(['inspections', 'survey', survey.inspectionId, survey.kind], survey);
      // The point count on the inspection changes.
      await queryClient.invalidateQueries({ queryKey: ['inspections', 'detail', survey.inspectionId] });
    },
  });
}
