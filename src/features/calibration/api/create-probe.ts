import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateProbeBody, ProbeDto } from '@shared/schemas/probes';
import { probesQueryOptions } from './get-probes';
import { calibrationDashboardQueryOptions } from './get-calibration-dashboard';

export const createProbe = (body: CreateProbeBody) => api.post<ProbeDto>('/probes', body);

export function useCreateProbe() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createProbe,
    onSuccess: () => Promise.all([
      qc.invalidateQueries({ queryKey: probesQueryOptions().queryKey }),
      qc.invalidateQueries({ queryKey: calibrationDashboardQueryOptions().queryKey }),
    ]),
  });
}
