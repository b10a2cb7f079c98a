import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { planKeys } from '@/lib/query-keys';

export const deletePlan = ({ planId }: { planId: number; siteId: number }) => api.delete<void>(`/plans/${planId}`);

/** Only an unused plan can go (the server answers 409 saying what holds one). */
export function useDeletePlan() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: deletePlan,
    onSuccess: (_r, v) => {
      qc.removeQueries({ queryKey: planKeys.detail(v.planId) });
      qc.invalidateQueries({ queryKey: planKeys.list(v.siteId) });
    },
  });
}
