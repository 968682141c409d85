import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SurveyComparison } from '@loambook/common';
import { api } from '@/lib/api-client';
import { jobKeys, jobPath } from './job-cache';

export function getSurveyComparison(id: string, signal?: AbortSignal): Promise<SurveyComparison> {
  return api.get<SurveyComparison>(jobPath(id, '/survey-comparison'), { signal });
}

export const surveyComparisonQueryOptions = (id: string) =>
  queryOptions({
    queryKey: jobKeys.comparison(id),
    queryFn: ({ signal }) => getSurveyComparison(id, signal),
  });

export function useSurveyComparison(id: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...surveyComparisonQueryOptions(id), enabled: options.enabled ?? true });
}
