import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { User } from '@shared/schemas/users';
import { userKeys } from '@/lib/query-keys';

export const getUsers = () => api.get<{ items: User[] }>('/users');
export const usersQueryOptions = () => queryOptions({ queryKey: userKeys.list(), queryFn: getUsers });
export const useUsers = () => useQuery(usersQueryOptions());
