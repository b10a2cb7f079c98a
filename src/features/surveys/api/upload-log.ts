import { useMutation } from '@tanstack/react-query';
import { api, type UploadProgress } from '@/lib/api-client';

/**
 * planId: the plan for rows whose plan column is empty; null leaves it to the log. matchWindowS and
 * clockOffsetS: how bursts without a place are placed by time on the survey's marks (server defaults: 20 s, 0 s).
 */
export const uploadLog = ({ surveyId, file, planId, matchWindowS, clockOffsetS, onProgress }: {
  surveyId: number; file: File; planId: number | null; matchWindowS?: number | null; clockOffsetS?: number | null; onProgress?: (p: UploadProgress) => void;
}) => {
  const form = new FormData();
  if (planId !== null) form.append('planId', String(planId));
  if (matchWindowS != null) form.append('matchWindowS', String(matchWindowS));
  if (clockOffsetS != null) form.append('clockOffsetS', String(clockOffsetS));
  form.append('file', file);
  return api.upload<{ importId: number }>(`/surveys/${surveyId}/logs`, form, onProgress);
};

/** The survey and its readings are refreshed once the import is done (see LogUpload). */
export const useUploadLog = () => useMutation({ mutationFn: uploadLog });
