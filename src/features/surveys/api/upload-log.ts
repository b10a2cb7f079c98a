import { useMutation } from '@tanstack/react-query';
import { api, type UploadProgress } from '@/lib/api-client';

/** planId: the plan for rows whose plan column is empty; null leaves it to the log. */
export const uploadLog = ({ surveyId, file, planId, onProgress }: { surveyId: number; file: File; planId: number | null; onProgress?: (p: UploadProgress) => void }) => {
  const form = new FormData();
  if (planId !== null) form.append('planId', String(planId));
  form.append('file', file);
  return api.upload<{ importId: number }>(`/surveys/${surveyId}/logs`, form, onProgress);
};

/** The survey and its readings are refreshed once the import is done (see LogUpload). */
export const useUploadLog = () => useMutation({ mutationFn: uploadLog });
