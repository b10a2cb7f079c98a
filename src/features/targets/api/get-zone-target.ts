import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ZoneTargetResponse } from '@shared/schemas/targets';
import { targetKeys } from '@/lib/query-keys';

export const getZoneTarget = (zoneId: number) => api.get<ZoneTargetResponse>(`/zones/${zoneId}/target`);
export const zoneTargetQueryOptions = (zoneId: number) => queryOptions({ queryKey: targetKeys.zone(zoneId), queryFn: () => getZoneTarget(zoneId) });
export const useZoneTarget = (zoneId: number) => useQuery(zoneTargetQueryOptions(zoneId));
