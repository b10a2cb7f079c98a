import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys, surveyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { EmergencyElement, EmergencyElementBody } from '@shared/schemas/emergency';

export const updateElement = ({ id, body }: { id: number; body: EmergencyElementBody }) => api.put<EmergencyElement>(`/emergency-elements/${id}`, body);

export function useUpdateElement() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateElement,
    onSuccess: (e) => {
      void qc.invalidateQueries({ queryKey: emergencyKeys.elements(e.planId) });
      void qc.invalidateQueries({ queryKey: emergencyKeys.surveys() });
      void qc.invalidateQueries({ queryKey: surveyKeys.details() });
    },
  });
}
