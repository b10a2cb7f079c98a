import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { OutboxListResponse, OutboxStatus } from '@shared/schemas/users';
import { outboxKeys } from '@/lib/query-keys';

export const getOutbox = (status?: OutboxStatus) => api.get<OutboxListResponse>(`/outbox${queryString({ status })}`);
export const outboxQueryOptions = (status?: OutboxStatus) => queryOptions({ queryKey: outboxKeys.list({ status }), queryFn: () => getOutbox(status), refetchInterval: 10_000 });
export const useOutbox = (status?: OutboxStatus) => useQuery(outboxQueryOptions(status));
