import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SendReportBody, SendReportResponse } from '@shared/schemas/reports';

export const sendReport = ({ surveyId, ...body }: SendReportBody & { surveyId: number }) => api.post<SendReportResponse>(`/surveys/${surveyId}/report/send`, body);

export const useSendReport = () => useMutation({ mutationFn: sendReport });
