import { queryOptions, useQuery } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { EmergencyElement } from '@shared/schemas/emergency';

export const getElements = (planId: number) => api.get<{ items: EmergencyElement[] }>(`/plans/${planId}/emergency-elements`);
export const elementsQueryOptions = (planId: number) => queryOptions({ queryKey: emergencyKeys.elements(planId), queryFn: () => getElements(planId) });
export const useElements = (planId: number | undefined) => useQuery({ ...elementsQueryOptions(planId ?? 0), enabled: planId !== undefined });
