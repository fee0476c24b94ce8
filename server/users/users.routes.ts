import { idParamSchema } from '#shared/api/common';
import { CAN } from '#shared/api/roles';
import { inviteSchema, updateUserSchema, userRowSchema } from '#shared/api/users';
import { z } from 'zod';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { listUsers } from './users.repository';
import { inviteUser, updateUser } from './users.service';

export function userRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'get', path: '/users', summary: "The plant's users", roles: CAN.manageUsers, response: z.array(userRowSchema),
      handler: ({ user }) => listUsers(d.ds, user.plantId),
    }),
    defineRoute({
      method: 'post', path: '/users', summary: 'Invite a user by e-mail', roles: CAN.manageUsers, body: inviteSchema, status: 201, response: userRowSchema,
      handler: ({ user, body }) => inviteUser(d, user, body),
    }),
    defineRoute({
      method: 'patch', path: '/users/:id', summary: 'Change a role or deactivate', roles: CAN.manageUsers, resource: 'user', params: idParamSchema, body: updateUserSchema, response: userRowSchema,
      handler: ({ user, params, body }) => updateUser(d, user, params.id, body),
    }),
  ];
}
