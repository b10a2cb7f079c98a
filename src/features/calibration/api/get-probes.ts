import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ProbeDto } from '@shared/schemas/probes';
import { probeKeys } from '@/lib/query-keys';

export const getProbes = () => api.get<{ items: ProbeDto[] }>('/probes');
export const probesQueryOptions = () => queryOptions({ queryKey: probeKeys.list(), queryFn: getProbes });
export const useProbes = (enabled = true) => useQuery({ ...probesQueryOptions(), enabled });
