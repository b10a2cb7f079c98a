import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PlanListResponse } from '@shared/schemas/plans';

/** The plans of the survey's site, for the upload's plan choice (same resource key as the plans screens). */
export const getSitePlans = (siteId: number) => api.get<PlanListResponse>(`/sites/${siteId}/plans`);
export const sitePlansQueryOptions = (siteId: number) => queryOptions({ queryKey: ['plans', { siteId }], queryFn: () => getSitePlans(siteId) });
export const useSitePlans = (siteId: number) => useQuery(sitePlansQueryOptions(siteId));
