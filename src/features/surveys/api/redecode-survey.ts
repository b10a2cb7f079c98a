import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { RedecodeResponse } from '@shared/schemas/readings';
import { probeKeys, siteKeys, surveyKeys } from '@/lib/query-keys';

export const redecodeSurvey = (surveyId: number) => api.post<RedecodeResponse>(`/surveys/${surveyId}/redecode`);

/** New readings: the survey with its readings, map and verdicts, the overview, and its probes' survey lists. */
const refreshSurvey = (qc: QueryClient, surveyId: number) => Promise.all([
  qc.invalidateQueries({ queryKey: surveyKeys.detail(surveyId) }),
  qc.invalidateQueries({ queryKey: siteKeys.overview() }),
  qc.invalidateQueries({ queryKey: probeKeys.details() }),
]);

export function useRedecodeSurvey(surveyId: number) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: () => redecodeSurvey(surveyId), onSuccess: () => refreshSurvey(qc, surveyId) });
}

/** Re-decode of a survey chosen when called, for lists of surveys (such as a probe's). */
export function useRedecodeAnySurvey() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (surveyId: number) => redecodeSurvey(surveyId), onSuccess: (_r, surveyId) => refreshSurvey(qc, surveyId) });
}
