import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateSurveyBody, Survey } from '@shared/schemas/surveys';
import { surveysQueryOptions } from './get-surveys';
import { sitesQueryOptions } from './get-sites';

export const createSurvey = (body: CreateSurveyBody) => api.post<Survey>('/surveys', body);

export function useCreateSurvey() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createSurvey,
    onSuccess: () => Promise.all([
      qc.invalidateQueries({ queryKey: surveysQueryOptions().queryKey }),
      qc.invalidateQueries({ queryKey: sitesQueryOptions().queryKey }),
    ]),
  });
}
