import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Survey, SurveyKind } from '@loambook/common';
import { api } from '@/lib/api-client';

export function getSurvey(id: string, kind: SurveyKind, signal?: AbortSignal): Promise<Survey> {
  return api.get<Survey>(`/inspections/${encodeURIComponent(id)}/survey`, { query: { kind }, signal });
}

export const surveyQueryOptions = (id: string, kind: SurveyKind) =>
  queryOptions({
    queryKey: ['inspections', 'survey', id, kind],
    queryFn: ({ signal }) => getSurvey(id, kind, signal),
  });

export function useSurvey(id: string, kind: SurveyKind = 'inspection') {
  return useQuery(surveyQueryOptions(id, kind));
}
