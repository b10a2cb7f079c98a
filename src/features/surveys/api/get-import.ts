import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ImportStatus } from '@shared/schemas/imports';
import { importKeys } from '@/lib/query-keys';

export const getImport = (id: number) => api.get<ImportStatus>(`/imports/${id}`);

/** Polls every 400 ms while the server is still reading the file. */
export const importQueryOptions = (id: number) => queryOptions({
  queryKey: importKeys.detail(id),
  queryFn: () => getImport(id),
  refetchInterval: (q) => (q.state.data && (q.state.data.status === 'done' || q.state.data.status === 'failed') ? false : 400),
});
export const useImport = (id: number | null) => useQuery({ ...importQueryOptions(id ?? 0), enabled: id !== null });
