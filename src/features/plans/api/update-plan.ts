import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Plan, UpdatePlanBody } from '@shared/schemas/plans';
import { planQueryOptions } from './get-plan';
import { sitePlansQueryOptions } from './get-site-plans';
import { zonesQueryOptions } from './get-zones';

export const updatePlan = ({ planId, ...body }: UpdatePlanBody & { planId: number }) => api.patch<Plan>(`/plans/${planId}`, body);

/** A new scale rescales the zones too, so both are refetched. */
export function useUpdatePlan() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updatePlan,
    onSuccess: (plan) => {
      qc.setQueryData(planQueryOptions(plan.id).queryKey, plan);
      qc.invalidateQueries({ queryKey: sitePlansQueryOptions(plan.siteId).queryKey });
      qc.invalidateQueries({ queryKey: zonesQueryOptions(plan.id).queryKey });
    },
  });
}
