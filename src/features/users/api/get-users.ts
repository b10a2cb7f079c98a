import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { User } from '@shared/schemas/users';

export const getUsers = () => api.get<{ items: User[] }>('/users');
export const usersQueryOptions = () => queryOptions({ queryKey: ['users'], queryFn: getUsers });
export const useUsers = () => useQuery(usersQueryOptions());
