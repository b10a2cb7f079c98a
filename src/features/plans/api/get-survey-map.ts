import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { SurveyMapResponse } from '@shared/schemas/plans';

/** A survey's readings on a plan (keys under 'surveys': a re-decode refreshes the map too). */
export const getSurveyMap = (surveyId: number, planId?: number) => api.get<SurveyMapResponse>(`/surveys/${surveyId}/map${queryString({ planId })}`);
export const surveyMapQueryOptions = (surveyId: number, planId?: number) =>
  queryOptions({ queryKey: ['surveys', surveyId, 'map', { planId: planId ?? null }], queryFn: () => getSurveyMap(surveyId, planId) });
export const useSurveyMap = (surveyId: number | undefined, planId?: number) =>
  useQuery({ ...surveyMapQueryOptions(surveyId ?? 0, planId), enabled: surveyId !== undefined });
