import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ForgotPasswordBody, SessionUser, TokenInfo, TokenPasswordBody } from '@shared/schemas/auth';
import { meQueryOptions } from './get-me';
import { authKeys } from '@/lib/query-keys';

export const getTokenInfo = (token: string) => api.get<TokenInfo>(`/auth/tokens?token=${encodeURIComponent(token)}`);
export const tokenInfoQueryOptions = (token: string) => queryOptions({ queryKey: authKeys.token(token), queryFn: () => getTokenInfo(token), enabled: token.length > 0 });
export const useTokenInfo = (token: string) => useQuery(tokenInfoQueryOptions(token));

/** Accepts an invitation or completes a reset: both set a password and sign in. */
export function useRedeemToken(purpose: 'invite' | 'reset') {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: TokenPasswordBody) => api.post<{ user: SessionUser }>(purpose === 'invite' ? '/auth/accept-invite' : '/auth/reset-password', body),
    onSuccess: ({ user }) => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, user);
    },
  });
}

export const useForgotPassword = () => useMutation({ mutationFn: (body: ForgotPasswordBody) => api.post<{ ok: true }>('/auth/forgot-password', body) });
