import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { BenchRunDetailDto } from '@shared/schemas/bench-runs';
import { benchRunKeys } from '@/lib/query-keys';

export const getBenchRun = (id: number) => api.get<BenchRunDetailDto>(`/bench-runs/${id}`);
export const benchRunQueryOptions = (id: number) => queryOptions({ queryKey: benchRunKeys.detail(id), queryFn: () => getBenchRun(id) });
export const useBenchRun = (id: number) => useQuery(benchRunQueryOptions(id));
