import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, queryString } from '@/lib/api-client';
import { auditKeys } from '@/lib/query-keys';

export type AuditEvent = {
  id: number; entityType: string; entityId: number; action: string; probeId: number | null; surveyId: number | null;
  before: unknown; after: unknown; createdAt: string; actorName: string | null; actorEmail: string | null;
};
export type AuditFilter = { probeId?: number; entityType?: string; limit?: number; offset?: number };

export const getAudit = (f: AuditFilter) => api.get<{ items: AuditEvent[] }>(`/audit${queryString(f)}`);
export const auditQueryOptions = (f: AuditFilter = {}) => queryOptions({ queryKey: auditKeys.list(f), queryFn: () => getAudit(f) });
export const useAudit = (f: AuditFilter) => useQuery(auditQueryOptions(f));
