import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ReturnSurveyBody, WorkflowState } from '@shared/schemas/workflow';
import { useInvalidateCompliance } from './use-invalidate-compliance';

export const returnSurvey = ({ surveyId, ...body }: ReturnSurveyBody & { surveyId: number }) => api.post<WorkflowState>(`/surveys/${surveyId}/return`, body);

export function useReturnSurvey() {
  const invalidate = useInvalidateCompliance();
  return useMutation({ mutationFn: returnSurvey, onSuccess: (s) => { void invalidate(s.surveyId, s); } });
}
