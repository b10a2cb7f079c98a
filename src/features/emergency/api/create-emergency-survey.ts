import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys, surveyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { CreateEmergencySurveyBody, EmergencySurvey } from '@shared/schemas/emergency';

export const createEmergencySurvey = (body: CreateEmergencySurveyBody) => api.post<EmergencySurvey>('/emergency/surveys', body);

export function useCreateEmergencySurvey() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createEmergencySurvey, onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: emergencyKeys.surveys() }), qc.invalidateQueries({ queryKey: surveyKeys.lists() })]) });
}
