import { queryOptions, useQuery } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { SiteLogbook } from '@shared/schemas/emergency';

export const getLogbook = (siteId: number) => api.get<SiteLogbook>(`/sites/${siteId}/emergency-tests?limit=100`);
export const logbookQueryOptions = (siteId: number) => queryOptions({ queryKey: emergencyKeys.logbook(siteId), queryFn: () => getLogbook(siteId) });
export const useLogbook = (siteId: number) => useQuery(logbookQueryOptions(siteId));
