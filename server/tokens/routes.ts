// Read-only token routes for testers and admins.
import { idParamsSchema } from '../../shared/api/common';
import { createTokenRequestSchema } from '../../shared/api/releases';
import { route } from '../middleware/route';
import { tokenView } from './presenter';
import { issueToken, revokeToken, visibleTokens } from './service';

const roles: ['tester', 'admin'] = ['tester', 'admin'];

/** Routes of /api/tokens. */
export const tokenRoutes = [
  route({
    method: 'post', path: '/tokens', access: roles, schema: { body: createTokenRequestSchema },
    handler: async ({ input, actor, app, res }) => {
      const { row, secret } = await issueToken(app, actor, input.body.name);
      res.status(201).json({ ...(await tokenView(row)), secret });
    },
  }),
  route({
    method: 'get', path: '/tokens', access: roles, schema: {},
    handler: async ({ actor, res }) => {
      res.json(await Promise.all((await visibleTokens(actor)).map(tokenView)));
    },
  }),
  route({
    method: 'delete', path: '/tokens/:id', access: roles, schema: { params: idParamsSchema },
    handler: async ({ input, actor, app, res }) => {
      res.json(await tokenView(await revokeToken(app, actor, input.params.id)));
    },
  }),
];
