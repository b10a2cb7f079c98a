import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ExclusionBody, PlacementBody, PlacementResult } from '@shared/schemas/planned-points';
import { useInvalidateSurveyPoints } from './use-invalidate-survey-points';

export const placeReading = ({ surveyId, readingId, body }: { surveyId: number; readingId: number; body: PlacementBody }) =>
  api.put<PlacementResult>(`/surveys/${surveyId}/readings/${readingId}/placement`, body);
export const setReadingExclusion = ({ surveyId, readingId, body }: { surveyId: number; readingId: number; body: ExclusionBody }) =>
  api.put<PlacementResult>(`/surveys/${surveyId}/readings/${readingId}/exclusion`, body);

export function usePlaceReading() {
  const invalidate = useInvalidateSurveyPoints();
  return useMutation({ mutationFn: placeReading, onSuccess: (_r, v) => invalidate(v.surveyId) });
}
export function useSetReadingExclusion() {
  const invalidate = useInvalidateSurveyPoints();
  return useMutation({ mutationFn: setReadingExclusion, onSuccess: (_r, v) => invalidate(v.surveyId) });
}
