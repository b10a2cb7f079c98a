import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { surveyKeys } from '@/lib/query-keys';
import type { FieldState } from '@shared/schemas/field';

export const getFieldState = (surveyId: number) => api.get<FieldState>(`/surveys/${surveyId}/field`);
// networkMode 'always': offline, the fetch fails at once and the view falls back to the phone's copy.
export const fieldStateQueryOptions = (surveyId: number) => queryOptions({
  queryKey: surveyKeys.field(surveyId), queryFn: () => getFieldState(surveyId), networkMode: 'always', retry: false, staleTime: 5_000,
});
