import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateAfterElementChange } from './invalidate-elements';

export const deleteElement = ({ id }: { id: number; planId: number }) => api.delete<void>(`/emergency-elements/${id}`);

export function useDeleteElement() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: deleteElement,
    onSuccess: (_r, v) => invalidateAfterElementChange(qc, v.planId),
  });
}
