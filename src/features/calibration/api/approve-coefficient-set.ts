import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CoefficientSetDto } from '@shared/schemas/coefficient-sets';
import { useInvalidateCalibration } from '../hooks/use-invalidate-calibration';

export const approveCoefficientSet = (id: number) => api.post<CoefficientSetDto>(`/coefficient-sets/${id}/approve`);

export function useApproveCoefficientSet() {
  const invalidate = useInvalidateCalibration();
  return useMutation({ mutationFn: approveCoefficientSet, onSuccess: (s) => invalidate(s.probeId) });
}
