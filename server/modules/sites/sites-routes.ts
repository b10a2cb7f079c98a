import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { createSiteBodySchema, siteListResponseSchema, siteSchema } from '@shared/schemas/sites';
import { createSite, getSite, listSites } from './sites-service';

export function registerSiteRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/sites', access: 'sites.read', tag: 'sites', summary: 'Sites of the organisation (a facility manager limited to sites sees only those)', response: siteListResponseSchema },
    ({ user }) => ({ items: listSites(deps.db, user) }));

  api.route({ method: 'post', path: '/sites', access: 'sites.write', tag: 'sites', summary: 'Create a site with its IANA time zone', body: createSiteBodySchema, status: 201, response: siteSchema },
    ({ user, body }) => createSite(deps, user, body));

  api.route({ method: 'get', path: '/sites/:id', access: 'sites.read', tag: 'sites', summary: 'One site', params: idParamsSchema, response: siteSchema },
    ({ user, params }) => getSite(deps.db, user, params.id));
}
