import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ZoneDetailResponse } from '@shared/schemas/compliance';
import { surveyComplianceQueryOptions } from './get-survey-compliance';

export const getZoneCompliance = (surveyId: number, zoneId: number) => api.get<ZoneDetailResponse>(`/surveys/${surveyId}/zones/${zoneId}/compliance`);
/** Under the survey's key, so whatever refreshes the survey's verdicts refreshes its zones too. */
export const zoneComplianceQueryOptions = (surveyId: number, zoneId: number) =>
  queryOptions({ queryKey: [...surveyComplianceQueryOptions(surveyId).queryKey, 'zones', zoneId], queryFn: () => getZoneCompliance(surveyId, zoneId) });
export const useZoneCompliance = (surveyId: number, zoneId: number) => useQuery(zoneComplianceQueryOptions(surveyId, zoneId));
