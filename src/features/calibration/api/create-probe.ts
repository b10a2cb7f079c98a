import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateProbeBody, ProbeDto } from '@shared/schemas/probes';
import { probeKeys } from '@/lib/query-keys';

export const createProbe = (body: CreateProbeBody) => api.post<ProbeDto>('/probes', body);

export function useCreateProbe() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createProbe,
    onSuccess: () => Promise.all([
      qc.invalidateQueries({ queryKey: probeKeys.list() }),
      qc.invalidateQueries({ queryKey: probeKeys.dashboard() }),
    ]),
  });
}
