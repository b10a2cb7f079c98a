import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { TargetListResponse } from '@shared/schemas/targets';

export const getTargets = () => api.get<TargetListResponse>('/targets');
export const targetsQueryOptions = () => queryOptions({ queryKey: ['targets'], queryFn: getTargets });
export const useTargets = () => useQuery(targetsQueryOptions());
