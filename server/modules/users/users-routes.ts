import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { invitationSentSchema, inviteBodySchema, updateUserBodySchema, userListResponseSchema, userSchema } from '@shared/schemas/users';
import { inviteUser, listUsers, sendInvitation, updateUser } from './users-service';

export function registerUserRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/users', access: 'users.manage', tag: 'users', summary: 'Users of the organisation', response: userListResponseSchema },
    ({ user }) => ({ items: listUsers(deps.db, user.organizationId) }));

  api.route({ method: 'post', path: '/invitations', access: 'users.manage', tag: 'users', summary: 'Invite a user by e-mail', body: inviteBodySchema, status: 201, response: userSchema },
    ({ user, body }) => inviteUser(deps, user, body));

  api.route({ method: 'post', path: '/users/:id/invitation', access: 'users.manage', tag: 'users', summary: 'Send a fresh invitation link', params: idParamsSchema, status: 202, response: invitationSentSchema },
    ({ user, params }) => { sendInvitation(deps, user, params.id); return { ok: true as const }; });

  api.route({ method: 'patch', path: '/users/:id', access: 'users.manage', tag: 'users', summary: 'Change a user\'s name, role, status or sites', params: idParamsSchema, body: updateUserBodySchema, response: userSchema },
    ({ user, params, body }) => updateUser(deps, user, params.id, body));
}
