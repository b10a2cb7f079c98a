import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateSurveyBody, Survey } from '@shared/schemas/surveys';
import { siteKeys, surveyKeys } from '@/lib/query-keys';

export const createSurvey = (body: CreateSurveyBody) => api.post<Survey>('/surveys', body);

export function useCreateSurvey() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createSurvey,
    onSuccess: () => Promise.all([
      qc.invalidateQueries({ queryKey: surveyKeys.lists() }),
      qc.invalidateQueries({ queryKey: siteKeys.all }),
    ]),
  });
}
