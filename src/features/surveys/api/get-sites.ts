import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SiteListResponse } from '@shared/schemas/sites';
import { siteKeys } from '@/lib/query-keys';

export const getSites = () => api.get<SiteListResponse>('/sites');
export const sitesQueryOptions = () => queryOptions({ queryKey: siteKeys.list(), queryFn: getSites });
export const useSites = () => useQuery(sitesQueryOptions());
