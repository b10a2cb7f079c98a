import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { ReadingsResponse } from '@shared/schemas/readings';
import type { ReadingFlag } from '@shared/core/types';
import { surveyKeys } from '@/lib/query-keys';

export type ReadingsFilter = { flag?: ReadingFlag; point?: string; sort: 'time' | 'point' | 'lux' | 'flag' | 'probe'; order: 'asc' | 'desc' };
export const READINGS_PAGE = 500;

export const getReadings = (surveyId: number, f: ReadingsFilter, offset: number, limit = READINGS_PAGE) =>
  api.get<ReadingsResponse>(`/surveys/${surveyId}/readings${queryString({ ...f, offset, limit })}`);

/** One page of readings; the virtualised table asks for the pages that scroll into view. */
export const readingsPageQueryOptions = (surveyId: number, f: ReadingsFilter = { sort: 'time', order: 'asc' }, page = 0) => queryOptions({
  queryKey: surveyKeys.readingsPage(surveyId, f, page),
  queryFn: () => getReadings(surveyId, f, page * READINGS_PAGE),
  placeholderData: keepPreviousData,
  staleTime: 30_000,
});
export const useReadingsPage = (surveyId: number, f: ReadingsFilter, page: number) => useQuery(readingsPageQueryOptions(surveyId, f, page));
