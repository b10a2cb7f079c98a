import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { EmergencySurvey, ResponseTimesBody } from '@shared/schemas/emergency';

export const setResponseTimes = ({ surveyId, elementId, body }: { surveyId: number; elementId: number; body: ResponseTimesBody }) =>
  api.put<EmergencySurvey>(`/emergency/surveys/${surveyId}/responses/${elementId}`, body);

export function useSetResponseTimes() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: setResponseTimes, onSuccess: (s) => qc.setQueryData(emergencyKeys.survey(s.surveyId), s) });
}
