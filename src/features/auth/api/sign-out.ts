import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { meQueryOptions } from './get-me';

export const signOut = () => api.post<void>('/auth/logout');

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, null);
    },
  });
}
