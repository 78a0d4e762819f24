// The Express application, built apart from `listen` (STYLE habit 20).
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { Router, type Express } from 'express';
import helmet from 'helmet';
import { analyzeRoutes } from './analyze/routes';
import { auditRoutes } from './audit/routes';
import { authRoutes } from './auth/routes';
import { designRoutes } from './designs/routes';
import { mailRoutes } from './mail/routes';
import { releaseRoutes } from './releases/routes';
import { revisionRoutes } from './revisions/routes';
import { reviewRoutes } from './reviews/routes';
import { simulationRoutes } from './simulation/routes';
import { tokenRoutes } from './tokens/routes';
import { userRoutes } from './users/routes';
import { createAuthenticator } from './middleware/authenticate';
import type { AppContext } from './middleware/context';
import { apiNotFound, errorHandler } from './middleware/errorHandler';
import { mountRoutes, route, type RouteDef } from './middleware/route';

/** Largest accepted JSON body (CONTRACT section 6: 413 above). */
export const JSON_LIMIT = '1mb';

const healthRoutes = [
  route({ method: 'get', path: '/health', access: 'anyone', schema: {}, handler: async ({ res }) => { res.json({ status: 'ok' }); } }),
];

/**
 * Every API route with its roles (paths relative to `/api`); tests walk this table.
 * @returns the route table.
 */
export function routeTable(): RouteDef[] {
  return [...healthRoutes, ...authRoutes, ...analyzeRoutes, ...designRoutes, ...revisionRoutes, ...reviewRoutes, ...releaseRoutes, ...tokenRoutes, ...userRoutes, ...mailRoutes, ...auditRoutes, ...simulationRoutes];
}

/**
 * Builds the app: security headers, JSON parsing, the API, and (when given) the built client with history fallback.
 * @param ctx - configuration, database and mailer.
 * @param options - optional folder of the built client.
 * @param options.clientDir - `dist/` to serve.
 * @returns the Express app.
 */
export function createApp(ctx: AppContext, options: { clientDir?: string } = {}): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', false);
  app.use(helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"], scriptSrc: ["'self'"], styleSrc: ["'self'", "'unsafe-inline'"], fontSrc: ["'self'", 'data:'],
        imgSrc: ["'self'", 'data:', 'blob:'], connectSrc: ["'self'"], workerSrc: ["'self'", 'blob:'], objectSrc: ["'none'"],
        baseUri: ["'self'"], formAction: ["'self'"], frameAncestors: ["'none'"],
      },
    },
  }));
  const log = (m: string) => { if (ctx.config.logLevel !== 'silent') process.stderr.write(`${m}\n`); };
  const api = Router();
  api.use(express.json({ limit: JSON_LIMIT, strict: true }));
  mountRoutes(api, routeTable(), ctx, createAuthenticator(ctx));
  api.use(apiNotFound);
  app.use('/api', api);
  const clientDir = options.clientDir;
  if (clientDir && existsSync(path.join(clientDir, 'index.html'))) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    app.get(/^(?!\/api\/).*/, (_req, res) => { res.set('Cache-Control', 'no-cache').sendFile(path.join(clientDir, 'index.html')); });
  }
  app.use(errorHandler(log));
  return app;
}
