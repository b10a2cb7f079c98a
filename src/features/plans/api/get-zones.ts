import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ZoneListResponse } from '@shared/schemas/zones';
import { planKeys } from '@/lib/query-keys';

export const getZones = (planId: number) => api.get<ZoneListResponse>(`/plans/${planId}/zones`);
export const zonesQueryOptions = (planId: number) => queryOptions({ queryKey: planKeys.zones(planId), queryFn: () => getZones(planId) });
export const useZones = (planId: number | undefined) => useQuery({ ...zonesQueryOptions(planId ?? 0), enabled: planId !== undefined });
