import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { InstallationInput, Survey } from '@shared/schemas/surveys';
import { siteKeys, surveyKeys } from '@/lib/query-keys';

export const setInstallation = ({ surveyId, ...body }: InstallationInput & { surveyId: number }) => api.put<Survey>(`/surveys/${surveyId}/installation`, body);

/** New or in service changes the survey and its verdicts; `onChanged` lets the page add its own refresh. */
export function useSetInstallation(onChanged?: () => unknown) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: setInstallation,
    onSuccess: async (_s, v) => {
      await Promise.all([
        qc.invalidateQueries({ queryKey: surveyKeys.detail(v.surveyId) }),
        qc.invalidateQueries({ queryKey: surveyKeys.lists() }),
        qc.invalidateQueries({ queryKey: siteKeys.overview() }),
      ]);
      await onChanged?.();
    },
  });
}
