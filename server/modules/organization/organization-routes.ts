import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { organizationSchema, updateOrganizationBodySchema } from '@shared/schemas/organization';
import { getOrganization, updateOrganization } from './organization-service';

export function registerOrganizationRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/organization', access: 'signed_in', tag: 'organization', summary: 'The caller\'s organisation and its decision rule', response: organizationSchema },
    ({ user }) => getOrganization(deps.db, user.organizationId));

  api.route({ method: 'patch', path: '/organization', access: 'organization.settings', tag: 'organization', summary: 'Choose the decision rule (simple or guarded, ILAC-G8:2019)', body: updateOrganizationBodySchema, response: organizationSchema },
    ({ user, body }) => updateOrganization(deps, user, body));
}
