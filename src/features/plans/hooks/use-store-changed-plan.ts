import { useQueryClient } from '@tanstack/react-query';
import type { Plan } from '@shared/schemas/plans';
import { planQueryOptions } from '../api/get-plan';
import { planKeys } from '@/lib/query-keys';

/** After a plan changed on the server: keep the answer as the plan and refetch its site's list. */
export function useStoreChangedPlan() {
  const qc = useQueryClient();
  return (plan: Plan) => {
    qc.setQueryData(planQueryOptions(plan.id).queryKey, plan);
    qc.invalidateQueries({ queryKey: planKeys.list(plan.siteId) });
  };
}
