import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Plan } from '@shared/schemas/plans';
import { planKeys } from '@/lib/query-keys';

export const getPlan = (planId: number) => api.get<Plan>(`/plans/${planId}`);
export const planQueryOptions = (planId: number) => queryOptions({ queryKey: planKeys.detail(planId), queryFn: () => getPlan(planId) });
export const usePlan = (planId: number) => useQuery(planQueryOptions(planId));
