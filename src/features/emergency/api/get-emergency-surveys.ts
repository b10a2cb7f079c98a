import { queryOptions, useQuery } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api, queryString } from '@/lib/api-client';

export type EmergencySurveyListItem = { surveyId: number; name: string; siteId: number; siteName: string; status: string; criteriaSetKey: string; startedOn: string | null; createdAt: string };

export const getEmergencySurveys = (siteId?: number) => api.get<{ items: EmergencySurveyListItem[] }>(`/emergency/surveys${queryString({ siteId })}`);
export const emergencySurveysQueryOptions = (siteId?: number) => queryOptions({ queryKey: emergencyKeys.surveyList({ siteId }), queryFn: () => getEmergencySurveys(siteId) });
export const useEmergencySurveys = (siteId?: number) => useQuery(emergencySurveysQueryOptions(siteId));
