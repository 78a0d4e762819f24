// Sign-in and the current account.
import { rateLimit } from 'express-rate-limit';
import { loginRequestSchema } from '../../shared/api/auth';
import { AppError } from '../errors';
import { ALL_ROLES, route } from '../middleware/route';
import { presentSessionUser } from '../users/presenter';
import { login } from './service';

/** Routes of /api/auth. */
export const authRoutes = [
  route({
    method: 'post', path: '/auth/login', access: 'anyone', schema: { body: loginRequestSchema },
    // Failed attempts per client address; successful sign-ins do not count.
    before: (app) => rateLimit({
      windowMs: app.config.loginWindowMs, limit: app.config.loginMaxFailures, skipSuccessfulRequests: true,
      standardHeaders: 'draft-8', legacyHeaders: false,
      handler: (_req, _res, next) => next(new AppError('rate-limited', 'too many failed sign-ins; wait and try again', 429)),
    }),
    handler: async ({ input, app, res }) => {
      const { token, user } = await login(app, input.body);
      res.json({ token, user: presentSessionUser(user) });
    },
  }),
  route({
    method: 'get', path: '/auth/me', access: ALL_ROLES, schema: {},
    handler: async ({ actor, res }) => { res.json(presentSessionUser(actor)); },
  }),
];
