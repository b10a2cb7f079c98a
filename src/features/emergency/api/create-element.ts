import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateAfterElementChange } from './invalidate-elements';
import type { EmergencyElement, EmergencyElementBody } from '@shared/schemas/emergency';

export const createElement = ({ planId, body }: { planId: number; body: EmergencyElementBody }) => api.post<EmergencyElement>(`/plans/${planId}/emergency-elements`, body);

export function useCreateElement() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createElement,
    onSuccess: (e) => invalidateAfterElementChange(qc, e.planId),
  });
}
