import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergencyKeys, surveyKeys } from '@/lib/query-keys';
import { api } from '@/lib/api-client';
import type { EmergencyElement, EmergencyElementBody } from '@shared/schemas/emergency';

export const createElement = ({ planId, body }: { planId: number; body: EmergencyElementBody }) => api.post<EmergencyElement>(`/plans/${planId}/emergency-elements`, body);

export function useCreateElement() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createElement,
    onSuccess: (e) => {
      void qc.invalidateQueries({ queryKey: emergencyKeys.elements(e.planId) });
      void qc.invalidateQueries({ queryKey: emergencyKeys.surveys() });
      void qc.invalidateQueries({ queryKey: surveyKeys.details() });
    },
  });
}
