import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SignOffBody, WorkflowState } from '@shared/schemas/workflow';
import { useInvalidateCompliance } from './use-invalidate-compliance';

export const signOffSurvey = ({ surveyId, ...body }: SignOffBody & { surveyId: number }) => api.post<WorkflowState>(`/surveys/${surveyId}/sign-off`, body);

export function useSignOffSurvey() {
  const invalidate = useInvalidateCompliance();
  return useMutation({ mutationFn: signOffSurvey, onSuccess: (s) => { void invalidate(s.surveyId, s); } });
}
