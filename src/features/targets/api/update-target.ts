import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { TargetEntry, UpdateTargetBody } from '@shared/schemas/targets';
import { targetsQueryOptions } from './get-targets';

export const updateTarget = ({ id, ...body }: UpdateTargetBody & { id: number }) => api.patch<TargetEntry>(`/targets/${id}`, body);

export function useUpdateTarget() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateTarget, onSuccess: () => qc.invalidateQueries({ queryKey: targetsQueryOptions().queryKey }) });
}
