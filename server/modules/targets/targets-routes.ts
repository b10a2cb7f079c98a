import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import {
  createTargetBodySchema, setZoneTargetBodySchema, targetListResponseSchema, targetSchema, updateTargetBodySchema,
  zoneTargetParamsSchema, zoneTargetResponseSchema,
} from '@shared/schemas/targets';
import { createTarget, listTargets, setZoneTarget, updateTarget, zoneTarget } from './targets-service';

export function registerTargetRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/targets', access: 'targets.read', tag: 'targets', summary: 'Target library: shipped entries and the organisation\'s own', response: targetListResponseSchema },
    ({ user }) => ({ items: listTargets(deps.db, user.organizationId) }));

  api.route({ method: 'post', path: '/targets', access: 'targets.write', tag: 'targets', summary: 'Add an organisation entry (e.g. a client\'s specification)', body: createTargetBodySchema, status: 201, response: targetSchema },
    ({ user, body }) => createTarget(deps, user, body));

  api.route({ method: 'patch', path: '/targets/:id', access: 'targets.write', tag: 'targets', summary: 'Edit an organisation entry (shipped entries are read-only)', params: idParamsSchema, body: updateTargetBodySchema, response: targetSchema },
    ({ user, params, body }) => updateTarget(deps, user, params.id, body));

  api.route({ method: 'get', path: '/zones/:zoneId/target', access: 'targets.read', tag: 'targets', summary: 'The library entry a zone is judged against', params: zoneTargetParamsSchema, response: zoneTargetResponseSchema },
    ({ user, params }) => zoneTarget(deps.db, user.organizationId, params.zoneId));

  api.route({ method: 'put', path: '/zones/:zoneId/target', access: 'plans.write', tag: 'targets', summary: 'Choose the library entry for a zone (null: by its use type), the value its design chose and the context modifiers behind it', params: zoneTargetParamsSchema, body: setZoneTargetBodySchema, response: zoneTargetResponseSchema },
    ({ user, params, body }) => setZoneTarget(deps, user, params.zoneId, body));
}
