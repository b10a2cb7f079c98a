import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import type { AuditListResponse } from '@shared/schemas/audit';
import { auditKeys } from '@/lib/query-keys';

export type AuditFilter = { probeId?: number; entityType?: string; limit?: number; offset?: number };

export const getAudit = (f: AuditFilter) => api.get<AuditListResponse>(`/audit${queryString(f)}`);
export const auditQueryOptions = (f: AuditFilter = {}) => queryOptions({ queryKey: auditKeys.list(f), queryFn: () => getAudit(f) });
export const useAudit = (f: AuditFilter) => useQuery(auditQueryOptions(f));
