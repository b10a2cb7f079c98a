import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { reportJobKeys } from '@/lib/query-keys';
import type { ReportJobState } from '@shared/schemas/reports';

/** Starts building a survey's PDF on the server; the answer is the job to poll. */
export const startReportJob = ({ surveyId, unit }: { surveyId: number; unit: 'lx' | 'fc' }) => api.post<ReportJobState>(`/surveys/${surveyId}/report-jobs`, { unit });
export const useStartReportJob = () => useMutation({ mutationFn: startReportJob });

export const getReportJob = (id: string) => api.get<ReportJobState>(`/report-jobs/${id}`);

/** Polls every 500 ms while the PDF is being built. */
export const reportJobQueryOptions = (id: string) => queryOptions({
  queryKey: reportJobKeys.detail(id),
  queryFn: () => getReportJob(id),
  refetchInterval: (q) => (q.state.data && q.state.data.status !== 'running' ? false : 500),
});
export const useReportJob = (id: string | null) => useQuery({ ...reportJobQueryOptions(id ?? ''), enabled: id !== null });

