import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { BenchRunDto } from '@shared/schemas/bench-runs';
import { probeKeys } from '@/lib/query-keys';

export const getBenchRuns = (probeId: number) => api.get<{ items: BenchRunDto[] }>(`/probes/${probeId}/bench-runs`);
export const benchRunsQueryOptions = (probeId: number) => queryOptions({ queryKey: probeKeys.benchRuns(probeId), queryFn: () => getBenchRuns(probeId) });
export const useBenchRuns = (probeId: number, enabled = true) => useQuery({ ...benchRunsQueryOptions(probeId), enabled });
