import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ProbeSurvey } from '@shared/schemas/probes';
import { probeKeys } from '@/lib/query-keys';

export const getProbeSurveys = (probeId: number) => api.get<{ items: ProbeSurvey[] }>(`/probes/${probeId}/surveys`);
export const probeSurveysQueryOptions = (probeId: number) => queryOptions({ queryKey: probeKeys.surveys(probeId), queryFn: () => getProbeSurveys(probeId) });
export const useProbeSurveys = (probeId: number, enabled: boolean) => useQuery({ ...probeSurveysQueryOptions(probeId), enabled: enabled && probeId > 0 });
