import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys, surveyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';

export const deleteElement = ({ id }: { id: number; planId: number }) => api.delete<void>(`/emergency-elements/${id}`);

export function useDeleteElement() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: deleteElement,
    onSuccess: (_r, v) => {
      void qc.invalidateQueries({ queryKey: emergencyKeys.elements(v.planId) });
      void qc.invalidateQueries({ queryKey: emergencyKeys.surveys() });
      void qc.invalidateQueries({ queryKey: surveyKeys.details() });
    },
  });
}
