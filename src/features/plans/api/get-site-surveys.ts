import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { SurveyListResponse } from '@shared/schemas/surveys';

/** Surveys of one site, to put on its plans or compare. */
export const getSiteSurveys = (siteId: number) => api.get<SurveyListResponse>(`/surveys${queryString({ siteId })}`);
export const siteSurveysQueryOptions = (siteId: number) => queryOptions({ queryKey: ['surveys', { siteId }], queryFn: () => getSiteSurveys(siteId) });
export const useSiteSurveys = (siteId: number | undefined, enabled = true) =>
  useQuery({ ...siteSurveysQueryOptions(siteId ?? 0), enabled: enabled && siteId !== undefined });
