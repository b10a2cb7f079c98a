import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ReadingSeries } from '@shared/schemas/readings';
import { surveyKeys } from '@/lib/query-keys';

export const getReadingSeries = (surveyId: number) => api.get<ReadingSeries>(`/surveys/${surveyId}/readings/series`);
export const readingSeriesQueryOptions = (surveyId: number) => queryOptions({ queryKey: surveyKeys.series(surveyId), queryFn: () => getReadingSeries(surveyId) });
export const useReadingSeries = (surveyId: number) => useQuery(readingSeriesQueryOptions(surveyId));
