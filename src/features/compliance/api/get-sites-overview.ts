import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SitesOverviewResponse } from '@shared/schemas/compliance';

export const getSitesOverview = () => api.get<SitesOverviewResponse>('/compliance/sites');
export const sitesOverviewQueryOptions = () => queryOptions({ queryKey: ['compliance', 'sites'], queryFn: getSitesOverview });
export const useSitesOverview = () => useQuery(sitesOverviewQueryOptions());
