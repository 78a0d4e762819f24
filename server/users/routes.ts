// Admin account routes.
import { idParamsSchema } from '../../shared/api/common';
import { createUserRequestSchema, updateUserRequestSchema } from '../../shared/api/users';
import { route } from '../middleware/route';
import { presentUser } from './presenter';
import { allUsers, changeUser, createUser } from './service';

/** Routes of /api/admin/users. */
export const userRoutes = [
  route({
    method: 'get', path: '/admin/users', access: ['admin'], schema: {},
    handler: async ({ res }) => { res.json((await allUsers()).map(presentUser)); },
  }),
  route({
    method: 'post', path: '/admin/users', access: ['admin'], schema: { body: createUserRequestSchema },
    handler: async ({ input, actor, app, res }) => { res.status(201).json(presentUser(await createUser(app, actor, input.body))); },
  }),
  route({
    method: 'patch', path: '/admin/users/:id', access: ['admin'], schema: { params: idParamsSchema, body: updateUserRequestSchema },
    handler: async ({ input, actor, app, res }) => { res.json(presentUser(await changeUser(app, actor, input.params.id, input.body))); },
  }),
];
