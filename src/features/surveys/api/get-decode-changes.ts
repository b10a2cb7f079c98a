import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { surveyKeys } from '@/lib/query-keys';
import type { DecodeChanges } from '@shared/schemas/readings';

export const getDecodeChanges = (surveyId: number) => api.get<DecodeChanges>(`/surveys/${surveyId}/decode-changes`);
export const decodeChangesQueryOptions = (surveyId: number) =>
  queryOptions({ queryKey: surveyKeys.decodeChanges(surveyId), queryFn: () => getDecodeChanges(surveyId) });
export const useDecodeChanges = (surveyId: number, enabled = true) => useQuery({ ...decodeChangesQueryOptions(surveyId), enabled });
