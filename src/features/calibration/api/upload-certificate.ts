import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CoefficientSetDto } from '@shared/schemas/coefficient-sets';
import { useInvalidateCalibration } from '../hooks/use-invalidate-calibration';

export const uploadCertificate = ({ id, file }: { id: number; file: File }) => {
  const form = new FormData();
  form.append('file', file);
  return api.upload<CoefficientSetDto>(`/coefficient-sets/${id}/certificate`, form);
};

export function useUploadCertificate() {
  const invalidate = useInvalidateCalibration();
  return useMutation({ mutationFn: uploadCertificate, onSuccess: (s) => invalidate(s.probeId) });
}
