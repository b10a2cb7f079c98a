import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SurveyDetail } from '@shared/schemas/surveys';
import { surveyKeys } from '@/lib/query-keys';

export const getSurvey = (id: number) => api.get<SurveyDetail>(`/surveys/${id}`);
export const surveyQueryOptions = (id: number) => queryOptions({ queryKey: surveyKeys.detail(id), queryFn: () => getSurvey(id) });
/** The survey; nothing is fetched while `id` is not known yet. */
export const useSurvey = (id: number | undefined) => useQuery({ ...surveyQueryOptions(id ?? 0), enabled: id !== undefined });
