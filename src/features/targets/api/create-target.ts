import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateTargetBody, TargetEntry } from '@shared/schemas/targets';
import { siteKeys, surveyKeys, targetKeys } from '@/lib/query-keys';

export const createTarget = (body: CreateTargetBody) => api.post<TargetEntry>('/targets', body);

export function useCreateTarget() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createTarget, onSuccess: () => Promise.all([
    qc.invalidateQueries({ queryKey: targetKeys.all }),
    // Verdicts of surveys not yet signed off follow the library.
    qc.invalidateQueries({ queryKey: surveyKeys.details() }),
    qc.invalidateQueries({ queryKey: siteKeys.overview() }),
  ]) });
}
