import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ZoneTargetResponse } from '@shared/schemas/targets';
import { targetsQueryOptions } from './get-targets';

export const getZoneTarget = (zoneId: number) => api.get<ZoneTargetResponse>(`/zones/${zoneId}/target`);
export const zoneTargetQueryOptions = (zoneId: number) => queryOptions({ queryKey: [...targetsQueryOptions().queryKey, 'zones', zoneId], queryFn: () => getZoneTarget(zoneId) });
export const useZoneTarget = (zoneId: number) => useQuery(zoneTargetQueryOptions(zoneId));
