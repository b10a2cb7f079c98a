import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { EmergencyPass } from '@shared/core/emergency';
import type { EmergencySurvey } from '@shared/schemas/emergency';

export const setLogPass = ({ surveyId, importId, pass }: { surveyId: number; importId: number; pass: EmergencyPass | null }) =>
  api.put<EmergencySurvey>(`/emergency/surveys/${surveyId}/logs/${importId}/pass`, { pass });

export function useSetLogPass() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: setLogPass, onSuccess: (s) => qc.setQueryData(emergencyKeys.survey(s.surveyId), s) });
}
