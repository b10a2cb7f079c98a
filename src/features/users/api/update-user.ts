import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { UpdateUserBody, User } from '@shared/schemas/users';
import { userKeys } from '@/lib/query-keys';

export const updateUser = ({ id, ...body }: UpdateUserBody & { id: number }) => api.patch<User>(`/users/${id}`, body);
export const resendInvitation = (id: number) => api.post<{ ok: true }>(`/users/${id}/invitation`);

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateUser, onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }) });
}

export const useResendInvitation = () => useMutation({ mutationFn: resendInvitation });
