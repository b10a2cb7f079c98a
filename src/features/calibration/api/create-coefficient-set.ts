import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CoefficientSetDto, CreateCoefficientSetBody } from '@shared/schemas/coefficient-sets';
import { useInvalidateCalibration } from '../hooks/use-invalidate-calibration';

export const createCoefficientSet = ({ probeId, body }: { probeId: number; body: CreateCoefficientSetBody }) => api.post<CoefficientSetDto>(`/probes/${probeId}/coefficient-sets`, body);

export function useCreateCoefficientSet() {
  const invalidate = useInvalidateCalibration();
  return useMutation({ mutationFn: createCoefficientSet, onSuccess: (s) => invalidate(s.probeId) });
}
