import { z } from 'zod';
import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { paginationQuerySchema } from '@shared/schemas/common';
import { can } from '@shared/policy';
import { listAudit } from './audit-service';

const auditQuerySchema = paginationQuerySchema.extend({
  probeId: z.coerce.number().int().positive().optional(),
  surveyId: z.coerce.number().int().positive().optional(),
  entityType: z.string().max(40).optional(),
});

export function registerAuditRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/audit', access: 'audit.read', tag: 'audit', summary: 'The append-only audit trail, newest first', query: auditQuerySchema },
    ({ user, query }) => ({ items: listAudit(deps.db, user.organizationId, { ...query, showCoefficients: can(user.role, 'coefficients.read') }) }));
}
