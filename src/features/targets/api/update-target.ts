import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { TargetEntry, UpdateTargetBody } from '@shared/schemas/targets';
import { siteKeys, surveyKeys, targetKeys } from '@/lib/query-keys';

export const updateTarget = ({ id, ...body }: UpdateTargetBody & { id: number }) => api.patch<TargetEntry>(`/targets/${id}`, body);

export function useUpdateTarget() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateTarget, onSuccess: () => Promise.all([
    qc.invalidateQueries({ queryKey: targetKeys.all }),
    // Verdicts of surveys not yet signed off follow the library.
    qc.invalidateQueries({ queryKey: surveyKeys.details() }),
    qc.invalidateQueries({ queryKey: siteKeys.overview() }),
  ]) });
}
