import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { useInvalidateCalibration } from '../hooks/use-invalidate-calibration';

export const discardCoefficientSet = ({ id }: { id: number; probeId: number }) => api.delete<void>(`/coefficient-sets/${id}`);

export function useDiscardCoefficientSet() {
  const invalidate = useInvalidateCalibration();
  return useMutation({ mutationFn: discardCoefficientSet, onSuccess: (_r, v) => invalidate(v.probeId) });
}
