import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { SurveyListResponse } from '@shared/schemas/surveys';

export const getSurveys = (siteId?: number) => api.get<SurveyListResponse>(`/surveys${queryString({ siteId })}`);
export const surveysQueryOptions = (siteId?: number) => queryOptions({ queryKey: siteId ? ['surveys', 'list', { siteId }] : ['surveys', 'list'], queryFn: () => getSurveys(siteId) });
export const useSurveys = (siteId?: number, options: { enabled?: boolean } = {}) => useQuery({ ...surveysQueryOptions(siteId), enabled: options.enabled ?? true });
