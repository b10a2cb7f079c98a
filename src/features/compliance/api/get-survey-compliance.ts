import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ComplianceResponse } from '@shared/schemas/compliance';
import { surveyKeys } from '@/lib/query-keys';

export const getSurveyCompliance = (surveyId: number) => api.get<ComplianceResponse>(`/surveys/${surveyId}/compliance`);
export const surveyComplianceQueryOptions = (surveyId: number) =>
  queryOptions({ queryKey: surveyKeys.compliance(surveyId), queryFn: () => getSurveyCompliance(surveyId) });
export const useSurveyCompliance = (surveyId: number) => useQuery(surveyComplianceQueryOptions(surveyId));
