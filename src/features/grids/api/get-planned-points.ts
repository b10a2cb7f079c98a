import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { PlannedPointsResponse } from '@shared/schemas/planned-points';
import { surveyKeys } from '@/lib/query-keys';

/** A survey's planned grids and points (keyed under the survey: an import or re-decode refreshes the reading counts too). */
export const getPlannedPoints = (surveyId: number, planId?: number) => api.get<PlannedPointsResponse>(`/surveys/${surveyId}/planned-points${queryString({ planId })}`);
export const plannedPointsQueryOptions = (surveyId: number, planId?: number) =>
  queryOptions({ queryKey: surveyKeys.plannedPoints(surveyId, planId ?? null), queryFn: () => getPlannedPoints(surveyId, planId) });
export const usePlannedPoints = (surveyId: number | undefined, planId?: number) =>
  useQuery({ ...plannedPointsQueryOptions(surveyId ?? 0, planId), enabled: surveyId !== undefined });
