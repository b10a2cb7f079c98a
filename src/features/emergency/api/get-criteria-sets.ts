import { queryOptions, useQuery } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { CriteriaSetDto } from '@shared/schemas/emergency';

export const getCriteriaSets = () => api.get<{ items: CriteriaSetDto[] }>('/emergency/criteria-sets');
export const criteriaSetsQueryOptions = () => queryOptions({ queryKey: emergencyKeys.criteriaSets(), queryFn: getCriteriaSets });
export const useCriteriaSets = () => useQuery(criteriaSetsQueryOptions());
