import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SubmitSurveyBody, WorkflowState } from '@shared/schemas/workflow';
import { useInvalidateCompliance } from './use-invalidate-compliance';

export const submitSurvey = ({ surveyId, ...body }: SubmitSurveyBody & { surveyId: number }) => api.post<WorkflowState>(`/surveys/${surveyId}/submit`, body);

export function useSubmitSurvey() {
  const invalidate = useInvalidateCompliance();
  return useMutation({ mutationFn: submitSurvey, onSuccess: (s) => { void invalidate(s.surveyId, s); } });
}
