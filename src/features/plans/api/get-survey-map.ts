import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { SurveyMapResponse } from '@shared/schemas/plans';
import { surveyKeys } from '@/lib/query-keys';

/** A survey's readings on a plan (keyed under the survey: a re-decode refreshes the map too). */
export const getSurveyMap = (surveyId: number, planId?: number) => api.get<SurveyMapResponse>(`/surveys/${surveyId}/map${queryString({ planId })}`);
export const surveyMapQueryOptions = (surveyId: number, planId?: number) =>
  queryOptions({ queryKey: surveyKeys.map(surveyId, planId ?? null), queryFn: () => getSurveyMap(surveyId, planId) });
export const useSurveyMap = (surveyId: number | undefined, planId?: number) =>
  useQuery({ ...surveyMapQueryOptions(surveyId ?? 0, planId), enabled: surveyId !== undefined });
