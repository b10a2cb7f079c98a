import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CoefficientSetDto } from '@shared/schemas/coefficient-sets';
import { probeKeys } from '@/lib/query-keys';

export const getCoefficientSets = (probeId: number) => api.get<{ items: CoefficientSetDto[] }>(`/probes/${probeId}/coefficient-sets`);
export const coefficientSetsQueryOptions = (probeId: number) => queryOptions({ queryKey: probeKeys.coefficientSets(probeId), queryFn: () => getCoefficientSets(probeId) });
export const useCoefficientSets = (probeId: number, enabled = true) => useQuery({ ...coefficientSetsQueryOptions(probeId), enabled });
