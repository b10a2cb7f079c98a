import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OutboxMessage } from '@shared/schemas/users';
import { outboxKeys } from '@/lib/query-keys';

export const getOutbox = () => api.get<{ items: OutboxMessage[] }>('/outbox');
export const outboxQueryOptions = () => queryOptions({ queryKey: outboxKeys.list(), queryFn: getOutbox, refetchInterval: 10_000 });
export const useOutbox = () => useQuery(outboxQueryOptions());
