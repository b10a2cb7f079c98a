import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SitesOverviewResponse } from '@shared/schemas/compliance';
import { siteKeys } from '@/lib/query-keys';

export const getSitesOverview = () => api.get<SitesOverviewResponse>('/compliance/sites');
export const sitesOverviewQueryOptions = () => queryOptions({ queryKey: siteKeys.overview(), queryFn: getSitesOverview });
export const useSitesOverview = () => useQuery(sitesOverviewQueryOptions());
