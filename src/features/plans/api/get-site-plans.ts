import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PlanListResponse } from '@shared/schemas/plans';
import { planKeys } from '@/lib/query-keys';

export const getSitePlans = (siteId: number) => api.get<PlanListResponse>(`/sites/${siteId}/plans`);
export const sitePlansQueryOptions = (siteId: number) => queryOptions({ queryKey: planKeys.list(siteId), queryFn: () => getSitePlans(siteId) });
export const useSitePlans = (siteId: number | undefined) => useQuery({ ...sitePlansQueryOptions(siteId ?? 0), enabled: siteId !== undefined });
