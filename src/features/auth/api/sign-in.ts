import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { LoginBody, SessionUser } from '@shared/schemas/auth';
import { meQueryOptions } from './get-me';

export const signIn = (body: LoginBody) => api.post<{ user: SessionUser }>('/auth/login', body);

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: ({ user }) => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, user);
    },
  });
}
