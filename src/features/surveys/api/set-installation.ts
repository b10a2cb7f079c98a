import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { InstallationInput, Survey } from '@shared/schemas/surveys';
import { surveysQueryOptions } from './get-surveys';

export const setInstallation = ({ surveyId, ...body }: InstallationInput & { surveyId: number }) => api.put<Survey>(`/surveys/${surveyId}/installation`, body);

/** `onChanged` lets the page refresh what depends on it (the survey's verdicts). */
export function useSetInstallation(onChanged?: () => unknown) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: setInstallation,
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: surveysQueryOptions().queryKey });
      await onChanged?.();
    },
  });
}
