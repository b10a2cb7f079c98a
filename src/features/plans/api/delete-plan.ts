import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { planQueryOptions } from './get-plan';
import { sitePlansQueryOptions } from './get-site-plans';

export const deletePlan = ({ planId }: { planId: number; siteId: number }) => api.delete<void>(`/plans/${planId}`);

/** Only an unused plan can go (the server answers 409 saying what holds one). */
export function useDeletePlan() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: deletePlan,
    onSuccess: (_r, v) => {
      qc.removeQueries({ queryKey: planQueryOptions(v.planId).queryKey });
      qc.invalidateQueries({ queryKey: sitePlansQueryOptions(v.siteId).queryKey });
    },
  });
}
