import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateTargetBody, TargetEntry } from '@shared/schemas/targets';
import { targetsQueryOptions } from './get-targets';

export const createTarget = (body: CreateTargetBody) => api.post<TargetEntry>('/targets', body);

export function useCreateTarget() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createTarget, onSuccess: () => qc.invalidateQueries({ queryKey: targetsQueryOptions().queryKey }) });
}
