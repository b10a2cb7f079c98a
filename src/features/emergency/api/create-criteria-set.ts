import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { CriteriaSetBody, CriteriaSetDto } from '@shared/schemas/emergency';

export const createCriteriaSet = (body: CriteriaSetBody) => api.post<CriteriaSetDto>('/emergency/criteria-sets', body);

export function useCreateCriteriaSet() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createCriteriaSet, onSuccess: () => qc.invalidateQueries({ queryKey: emergencyKeys.criteriaSets() }) });
}
