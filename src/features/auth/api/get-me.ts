import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SessionUser } from '@shared/schemas/auth';
import { authKeys } from '@/lib/query-keys';

/** The signed-in user, or null when signed out (GET /auth/session answers 200 either way, so nothing is logged as an error). */
export async function getMe(): Promise<SessionUser | null> {
  return (await api.get<{ user: SessionUser | null }>('/auth/session')).user;
}

export const meQueryOptions = () => queryOptions({ queryKey: authKeys.me(), queryFn: getMe, staleTime: 5 * 60_000 });

export const useMe = () => useQuery(meQueryOptions());
