import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ProbeDto } from '@shared/schemas/probes';

export const getProbes = () => api.get<{ items: ProbeDto[] }>('/probes');
export const probesQueryOptions = () => queryOptions({ queryKey: ['probes', 'list'], queryFn: getProbes });
export const useProbes = (enabled = true) => useQuery({ ...probesQueryOptions(), enabled });
