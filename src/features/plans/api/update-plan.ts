import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Plan, UpdatePlanBody } from '@shared/schemas/plans';
import { useStoreChangedPlan } from '../hooks/use-store-changed-plan';
import { planKeys } from '@/lib/query-keys';

export const updatePlan = ({ planId, ...body }: UpdatePlanBody & { planId: number }) => api.patch<Plan>(`/plans/${planId}`, body);

/** A new scale rescales the zones too, so both are refetched. */
export function useUpdatePlan() {
  const qc = useQueryClient();
  const store = useStoreChangedPlan();
  return useMutation({
    mutationFn: updatePlan,
    onSuccess: (plan) => {
      store(plan);
      qc.invalidateQueries({ queryKey: planKeys.zones(plan.id) });
    },
  });
}
