import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { CriteriaSetBody, CriteriaSetDto } from '@shared/schemas/emergency';

export const updateCriteriaSet = ({ key, body }: { key: string; body: CriteriaSetBody }) => api.put<CriteriaSetDto>(`/emergency/criteria-sets/${encodeURIComponent(key)}`, body);

/** Live surveys judged against the set change with it, so the emergency surveys refresh too. */
export function useUpdateCriteriaSet() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateCriteriaSet,
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: emergencyKeys.criteriaSets() });
      void qc.invalidateQueries({ queryKey: emergencyKeys.surveys() });
    },
  });
}
