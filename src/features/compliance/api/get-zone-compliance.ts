import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ZoneDetailResponse } from '@shared/schemas/compliance';
import { surveyKeys } from '@/lib/query-keys';

export const getZoneCompliance = (surveyId: number, zoneId: number) => api.get<ZoneDetailResponse>(`/surveys/${surveyId}/zones/${zoneId}/compliance`);
/** Under the survey's key, so whatever refreshes the survey's verdicts refreshes its zones too. */
export const zoneComplianceQueryOptions = (surveyId: number, zoneId: number) =>
  queryOptions({ queryKey: surveyKeys.zoneCompliance(surveyId, zoneId), queryFn: () => getZoneCompliance(surveyId, zoneId) });
export const useZoneCompliance = (surveyId: number, zoneId: number) => useQuery(zoneComplianceQueryOptions(surveyId, zoneId));
