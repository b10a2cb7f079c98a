import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ProbeDto, UpdateProbeBody } from '@shared/schemas/probes';
import { probesQueryOptions } from './get-probes';
import { probeQueryOptions } from './get-probe';
import { calibrationDashboardQueryOptions } from './get-calibration-dashboard';

export const updateProbe = ({ id, ...body }: UpdateProbeBody & { id: number }) => api.patch<ProbeDto>(`/probes/${id}`, body);

export function useUpdateProbe() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateProbe,
    onSuccess: (p) => Promise.all([
      qc.invalidateQueries({ queryKey: probesQueryOptions().queryKey }),
      qc.invalidateQueries({ queryKey: probeQueryOptions(p.id).queryKey }),
      qc.invalidateQueries({ queryKey: calibrationDashboardQueryOptions().queryKey }),
    ]),
  });
}
