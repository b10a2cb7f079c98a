import { useQuery } from '@tanstack/react-query';
import { meQueryOptions } from '@/features/auth/api/get-me';
import type { SessionUser } from '@shared/schemas/auth';

/** The signed-in user inside the app shell (its loader guarantees one). */
export function useCurrentUser(): SessionUser {
  const { data } = useQuery(meQueryOptions());
  if (!data) throw new Error('useCurrentUser used outside the signed-in shell');
  return data;
}
