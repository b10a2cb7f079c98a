import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { TargetListResponse } from '@shared/schemas/targets';
import { targetKeys } from '@/lib/query-keys';

export const getTargets = () => api.get<TargetListResponse>('/targets');
export const targetsQueryOptions = () => queryOptions({ queryKey: targetKeys.list(), queryFn: getTargets });
export const useTargets = () => useQuery(targetsQueryOptions());
