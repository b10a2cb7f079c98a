import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, type UploadProgress } from '@/lib/api-client';
import type { BenchRunDetailDto } from '@shared/schemas/bench-runs';
import { probeKeys } from '@/lib/query-keys';

export type BenchUploadInput = { probeId: number; file: File; fields: Record<string, string>; onProgress?: (p: UploadProgress) => void };

export const uploadBenchRun = ({ probeId, file, fields, onProgress }: BenchUploadInput) => {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) if (v !== '') form.append(k, v);
  form.append('file', file);
  return api.upload<BenchRunDetailDto>(`/probes/${probeId}/bench-runs`, form, onProgress);
};

export function useUploadBenchRun() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: uploadBenchRun, onSuccess: (r) => qc.invalidateQueries({ queryKey: probeKeys.benchRuns(r.probeId) }) });
}
