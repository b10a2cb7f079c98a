import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ProbeDto } from '@shared/schemas/probes';
import { probeKeys } from '@/lib/query-keys';

export const getProbe = (id: number) => api.get<ProbeDto>(`/probes/${id}`);
export const probeQueryOptions = (id: number) => queryOptions({ queryKey: probeKeys.detail(id), queryFn: () => getProbe(id) });
export const useProbe = (id: number) => useQuery({ ...probeQueryOptions(id), enabled: id > 0 });
