import { queryOptions, useQuery } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { EmergencySurvey } from '@shared/schemas/emergency';

export const getEmergencySurvey = (surveyId: number) => api.get<EmergencySurvey>(`/emergency/surveys/${surveyId}`);
export const emergencySurveyQueryOptions = (surveyId: number) => queryOptions({ queryKey: emergencyKeys.survey(surveyId), queryFn: () => getEmergencySurvey(surveyId) });
export const useEmergencySurvey = (surveyId: number) => useQuery(emergencySurveyQueryOptions(surveyId));
