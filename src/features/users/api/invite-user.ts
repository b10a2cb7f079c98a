import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { InviteBody, User } from '@shared/schemas/users';
import { userKeys } from '@/lib/query-keys';

export const inviteUser = (body: InviteBody) => api.post<User>('/invitations', body);

export function useInviteUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: inviteUser, onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }) });
}
