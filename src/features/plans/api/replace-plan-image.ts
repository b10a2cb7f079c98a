import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, type UploadProgress } from '@/lib/api-client';
import type { Plan } from '@shared/schemas/plans';
import { useStoreChangedPlan } from '../hooks/use-store-changed-plan';
import { surveyKeys } from '@/lib/query-keys';

export type ReplacePlanImageInput = { planId: number; file: File; onProgress?: (p: UploadProgress) => void };

export function replacePlanImage({ planId, file, onProgress }: ReplacePlanImageInput) {
  const form = new FormData();
  form.append('file', file);
  return api.upload<Plan>(`/plans/${planId}/image`, form, onProgress, undefined, 'PUT');
}

/** Zones keep their coordinates in metres; survey maps and verdicts are refetched (the plan's edge may have moved). */
export function useReplacePlanImage() {
  const qc = useQueryClient();
  const store = useStoreChangedPlan();
  return useMutation({
    mutationFn: replacePlanImage,
    onSuccess: (plan) => {
      store(plan);
      qc.invalidateQueries({ queryKey: surveyKeys.details() });
    },
  });
}
