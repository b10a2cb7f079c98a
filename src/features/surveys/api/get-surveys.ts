import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { SurveyListResponse } from '@shared/schemas/surveys';
import { surveyKeys } from '@/lib/query-keys';

export const getSurveys = (siteId?: number) => api.get<SurveyListResponse>(`/surveys${queryString({ siteId })}`);
export const surveysQueryOptions = (siteId?: number) => queryOptions({ queryKey: surveyKeys.list(siteId ? { siteId } : {}), queryFn: () => getSurveys(siteId) });
export const useSurveys = (siteId?: number, options: { enabled?: boolean } = {}) => useQuery({ ...surveysQueryOptions(siteId), enabled: options.enabled ?? true });
