import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, type UploadProgress } from '@/lib/api-client';
import type { Plan } from '@shared/schemas/plans';
import { planKeys } from '@/lib/query-keys';

export type UploadPlanInput = { siteId: number; file: File; name: string; widthM?: number; onProgress?: (p: UploadProgress) => void };

export function uploadPlan({ siteId, file, name, widthM, onProgress }: UploadPlanInput) {
  const form = new FormData();
  form.append('name', name);
  if (widthM !== undefined) form.append('widthM', String(widthM));
  form.append('file', file);
  return api.upload<Plan>(`/sites/${siteId}/plans`, form, onProgress);
}

export function useUploadPlan() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: uploadPlan, onSuccess: (_p, v) => qc.invalidateQueries({ queryKey: planKeys.list(v.siteId) }) });
}
