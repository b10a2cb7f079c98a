import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateAfterElementChange } from './invalidate-elements';
import type { EmergencyElement, EmergencyElementBody } from '@shared/schemas/emergency';

export const updateElement = ({ id, body }: { id: number; body: EmergencyElementBody }) => api.put<EmergencyElement>(`/emergency-elements/${id}`, body);

export function useUpdateElement() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateElement,
    onSuccess: (e) => invalidateAfterElementChange(qc, e.planId),
  });
}
