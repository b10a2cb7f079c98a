import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { UnplacedResponse } from '@shared/schemas/planned-points';
import { surveyKeys } from '@/lib/query-keys';

/** Task readings of a survey without a place on a plan, grouped by label. */
export const getUnplaced = (surveyId: number) => api.get<UnplacedResponse>(`/surveys/${surveyId}/unplaced`);
export const unplacedQueryOptions = (surveyId: number) => queryOptions({ queryKey: surveyKeys.unplaced(surveyId), queryFn: () => getUnplaced(surveyId) });
export const useUnplaced = (surveyId: number) => useQuery(unplacedQueryOptions(surveyId));
