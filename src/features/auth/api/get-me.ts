import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, ApiRequestError } from '@/lib/api-client';
import type { SessionUser } from '@shared/schemas/auth';
import { authKeys } from '@/lib/query-keys';

/** The signed-in user, or null when signed out (a 401 is an answer here, not an error). */
export async function getMe(): Promise<SessionUser | null> {
  try {
    return (await api.get<{ user: SessionUser }>('/auth/me')).user;
  } catch (err) {
    if (err instanceof ApiRequestError && err.status === 401) return null;
    throw err;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: authKeys.me(), queryFn: getMe, staleTime: 5 * 60_000 });

export const useMe = () => useQuery(meQueryOptions());
