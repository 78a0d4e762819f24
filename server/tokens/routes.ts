// Read-only token routes for testers and admins.
import { idParamsSchema } from '../../shared/api/common';
import { createTokenRequestSchema } from '../../shared/api/releases';
import { route } from '../middleware/route';
import { findUser } from '../users/repository';
import { presentToken } from './presenter';
import { issueToken, revokeToken, visibleTokens } from './service';

const roles: ['tester', 'admin'] = ['tester', 'admin'];

/** Routes of /api/tokens. */
export const tokenRoutes = [
  route({
    method: 'post', path: '/tokens', access: roles, schema: { body: createTokenRequestSchema },
    handler: async ({ input, actor, app, res }) => {
      const { row, secret } = await issueToken(app, actor, input.body.name);
      res.status(201).json({ ...presentToken(row, await findUser(row.ownerId)), secret });
    },
  }),
  route({
    method: 'get', path: '/tokens', access: roles, schema: {},
    handler: async ({ actor, res }) => {
      const rows = await visibleTokens(actor);
      res.json(await Promise.all(rows.map(async (r) => presentToken(r, await findUser(r.ownerId)))));
    },
  }),
  route({
    method: 'delete', path: '/tokens/:id', access: roles, schema: { params: idParamsSchema },
    handler: async ({ input, actor, app, res }) => {
      const row = await revokeToken(app, actor, input.params.id);
      res.json(presentToken(row, await findUser(row.ownerId)));
    },
  }),
];
