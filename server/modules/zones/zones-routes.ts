import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { updateZoneBodySchema, zoneBodySchema, zoneListResponseSchema, zoneSchema } from '@shared/schemas/zones';
import { createZone, deleteZone, listZones, updateZone } from './zones-service';

export function registerZoneRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/plans/:id/zones', access: 'sites.read', tag: 'zones', summary: 'Zones drawn on a plan', params: idParamsSchema, response: zoneListResponseSchema },
    ({ user, params }) => ({ items: listZones(deps.db, user, params.id) }));

  api.route({ method: 'post', path: '/plans/:id/zones', access: 'plans.write', tag: 'zones', summary: 'Add a zone (polygon in plan metres); an invalid outline answers 422', params: idParamsSchema, body: zoneBodySchema, status: 201, response: zoneSchema },
    ({ user, params, body }) => createZone(deps, user, params.id, body));

  api.route({ method: 'patch', path: '/zones/:id', access: 'plans.write', tag: 'zones', summary: 'Change a zone', params: idParamsSchema, body: updateZoneBodySchema, response: zoneSchema },
    ({ user, params, body }) => updateZone(deps, user, params.id, body));

  api.route({ method: 'delete', path: '/zones/:id', access: 'plans.write', tag: 'zones', summary: 'Delete a zone', params: idParamsSchema },
    ({ user, params }) => { deleteZone(deps, user, params.id); });
}
