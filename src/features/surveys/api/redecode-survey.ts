import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { RedecodeResponse } from '@shared/schemas/readings';
import { surveyQueryOptions } from './get-survey';
import { surveyReadingsKey } from './get-readings';

export const redecodeSurvey = (surveyId: number) => api.post<RedecodeResponse>(`/surveys/${surveyId}/redecode`);

export function useRedecodeSurvey(surveyId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => redecodeSurvey(surveyId),
    onSuccess: () => Promise.all([
      qc.invalidateQueries({ queryKey: surveyQueryOptions(surveyId).queryKey }),
      qc.invalidateQueries({ queryKey: surveyReadingsKey(surveyId) }),
    ]),
  });
}
