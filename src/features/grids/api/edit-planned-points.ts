import { useMutation } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { CreatePlannedPointBody, GenerateGridBody, MovePlannedPointBody, PlannedPoint, PlannedPointsResponse, SurveyGrid } from '@shared/schemas/planned-points';
import { useInvalidateSurveyPoints } from './use-invalidate-survey-points';

export const generateGrid = ({ surveyId, ...body }: GenerateGridBody & { surveyId: number }) => api.post<PlannedPointsResponse>(`/surveys/${surveyId}/planned-points/generate`, body);
export const createPlannedPoint = ({ surveyId, ...body }: CreatePlannedPointBody & { surveyId: number }) => api.post<PlannedPoint>(`/surveys/${surveyId}/planned-points`, body);
export const movePlannedPoint = ({ surveyId, pointId, ...body }: MovePlannedPointBody & { surveyId: number; pointId: number }) => api.patch<PlannedPoint>(`/surveys/${surveyId}/planned-points/${pointId}`, body);
export const deletePlannedPoint = ({ surveyId, pointId, reason }: { surveyId: number; pointId: number; reason?: string }) => api.delete<void>(`/surveys/${surveyId}/planned-points/${pointId}${queryString({ reason })}`);
export const justifyGrid = ({ surveyId, gridId, reason }: { surveyId: number; gridId: number; reason: string }) => api.put<SurveyGrid>(`/surveys/${surveyId}/grids/${gridId}/reason`, { reason });

function useSurveyMutation<V extends { surveyId: number }, R>(fn: (v: V) => Promise<R>) {
  const invalidate = useInvalidateSurveyPoints();
  return useMutation({ mutationFn: fn, onSuccess: (_r, v) => invalidate(v.surveyId) });
}

export const useGenerateGrid = () => useSurveyMutation(generateGrid);
export const useCreatePlannedPoint = () => useSurveyMutation(createPlannedPoint);
export const useMovePlannedPoint = () => useSurveyMutation(movePlannedPoint);
export const useDeletePlannedPoint = () => useSurveyMutation(deletePlannedPoint);
export const useJustifyGrid = () => useSurveyMutation(justifyGrid);
