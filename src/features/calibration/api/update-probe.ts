import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ProbeDto, UpdateProbeBody } from '@shared/schemas/probes';
import { probeKeys } from '@/lib/query-keys';

export const updateProbe = ({ id, ...body }: UpdateProbeBody & { id: number }) => api.patch<ProbeDto>(`/probes/${id}`, body);

export function useUpdateProbe() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateProbe,
    onSuccess: (p) => Promise.all([
      qc.invalidateQueries({ queryKey: probeKeys.list() }),
      qc.invalidateQueries({ queryKey: probeKeys.detail(p.id) }),
      qc.invalidateQueries({ queryKey: probeKeys.dashboard() }),
    ]),
  });
}
