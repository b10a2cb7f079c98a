import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { RedecodeResponse } from '@shared/schemas/readings';
import { probeSurveysQueryOptions } from './get-probe-surveys';

export const redecodeSurvey = (surveyId: number) => api.post<RedecodeResponse>(`/surveys/${surveyId}/redecode`);

/** Re-decodes one survey with the approved sets in force now; refreshes the probe's survey list. */
export function useRedecodeSurvey(probeId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: redecodeSurvey,
    onSuccess: () => qc.invalidateQueries({ queryKey: probeSurveysQueryOptions(probeId).queryKey }),
  });
}
