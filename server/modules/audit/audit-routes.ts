import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { auditListResponseSchema, auditQuerySchema } from '@shared/schemas/audit';
import { can } from '@shared/policy';
import { listAudit } from './audit-service';

export function registerAuditRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/audit', access: 'audit.read', tag: 'audit', summary: 'The append-only audit trail, newest first', query: auditQuerySchema, response: auditListResponseSchema },
    ({ user, query }) => ({ items: listAudit(deps.db, user.organizationId, { ...query, showCoefficients: can(user.role, 'coefficients.read') }) }));
}
