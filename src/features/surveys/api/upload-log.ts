import { useMutation } from '@tanstack/react-query';
import { api, type UploadProgress } from '@/lib/api-client';

export const uploadLog = ({ surveyId, file, onProgress }: { surveyId: number; file: File; onProgress?: (p: UploadProgress) => void }) => {
  const form = new FormData();
  form.append('file', file);
  return api.upload<{ importId: number }>(`/surveys/${surveyId}/logs`, form, onProgress);
};

/** The survey and its readings are refreshed once the import is done (see LogUpload). */
export const useUploadLog = () => useMutation({ mutationFn: uploadLog });
