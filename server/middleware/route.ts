// Route declarations: every route states method, path, roles and schemas, so the app registers
// them uniformly and a test can walk the whole table with every role.
import type { Request, RequestHandler, Response, Router } from 'express';
import type { z } from 'zod';
import type { Role } from '../../shared/api/common';
import { forbidden, unauthorized, validationError, type FieldProblem } from '../errors';
import type { Actor, AppContext, UserActor } from './context';
import type { Authenticator } from './authenticate';

/** Who may call a route: nobody signed in needed, any signed-in role, or a list of roles. */
export type Access = 'anyone' | Role[];

/** Schemas for the parts of a request. */
export interface RouteSchemas {
  body?: z.ZodType;
  params?: z.ZodType;
  query?: z.ZodType;
}

type Parsed<S extends RouteSchemas> = {
  body: S['body'] extends z.ZodType ? z.infer<S['body']> : undefined;
  params: S['params'] extends z.ZodType ? z.infer<S['params']> : undefined;
  query: S['query'] extends z.ZodType ? z.infer<S['query']> : undefined;
};

/** What a handler receives: only parsed input, the actor, the app services and the response. */
export interface HandlerArgs<S extends RouteSchemas, A extends Actor | null> {
  input: Parsed<S>;
  actor: A;
  app: AppContext;
  req: Request;
  res: Response;
}

/** One route of the table. */
export interface RouteDef {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  access: Access;
  /** Read-only access tokens are accepted too (release routes only). */
  tokens: boolean;
  schema: RouteSchemas;
  /** Extra middleware before validation (e.g. the sign-in rate limit). */
  before?: (app: AppContext) => RequestHandler;
  handler: (args: HandlerArgs<RouteSchemas, Actor | null>) => Promise<void>;
}

/** All four roles. */
export const ALL_ROLES: Role[] = ['engineer', 'reviewer', 'tester', 'admin'];

/**
 * Declares a route. The handler's actor type follows from `access`/`tokens`.
 * @param def - the declaration.
 * @returns the route.
 */
export function route<S extends RouteSchemas, T extends boolean = false, Acc extends Access = Access>(def: {
  method: RouteDef['method'];
  path: string;
  access: Acc;
  tokens?: T;
  schema: S;
  before?: RouteDef['before'];
  handler: (args: HandlerArgs<S, Acc extends 'anyone' ? Actor | null : T extends true ? Actor : UserActor>) => Promise<void>;
}): RouteDef {
  return { ...def, tokens: def.tokens ?? false, handler: def.handler as RouteDef['handler'] };
}

/**
 * Formats a zod issue path like the design schema does: `design.currentLoop.harmonics.2`.
 * @param prefix - part of the request (`''` for the body).
 * @param path - the issue path.
 * @returns the dotted path.
 */
export function formatPath(prefix: string, path: readonly PropertyKey[]): string {
  let out = prefix;
  for (const key of path) {
    out += out === '' ? String(key) : `.${String(key)}`;
  }
  return out;
}

function parsePart(schema: z.ZodType | undefined, value: unknown, prefix: string, problems: FieldProblem[]): unknown {
  if (schema === undefined) return undefined;
  const result = schema.safeParse(value ?? (prefix === '' ? undefined : {}));
  if (result.success) return result.data;
  for (const issue of result.error.issues) problems.push({ path: formatPath(prefix, issue.path), message: issue.message });
  return undefined;
}

/**
 * Registers every route on a router: authenticate → role guard → validate → handler.
 * @param router - the Express router.
 * @param routes - the table.
 * @param app - the app services.
 * @param authenticator - turns the Authorization header into an actor.
 */
export function mountRoutes(router: Router, routes: RouteDef[], app: AppContext, authenticator: Authenticator): void {
  for (const def of routes) {
    const guard: RequestHandler = async (req, res, next) => {
      try {
        if (def.access === 'anyone') {
          res.locals.actor = null;
          return next();
        }
        const actor = await authenticator(req, def.tokens);
        if (actor === null) throw unauthorized();
        if (actor.kind === 'user' && !def.access.includes(actor.role)) {
          throw forbidden(`role ${actor.role} may not ${def.method.toUpperCase()} ${def.path} (allowed: ${def.access.join(', ')})`);
        }
        res.locals.actor = actor;
        next();
      } catch (err) {
        next(err);
      }
    };
    const validate: RequestHandler = (req, res, next) => {
      const problems: FieldProblem[] = [];
      const input = {
        params: parsePart(def.schema.params, req.params, 'params', problems),
        query: parsePart(def.schema.query, req.query, 'query', problems),
        body: parsePart(def.schema.body, req.body, '', problems),
      };
      if (problems.length > 0) return next(validationError(problems));
      res.locals.input = input;
      next();
    };
    const handle: RequestHandler = async (req, res) => {
      await def.handler({ input: res.locals.input, actor: res.locals.actor, app, req, res });
    };
    const chain = def.before ? [def.before(app), guard, validate, handle] : [guard, validate, handle];
    router[def.method](def.path, ...chain);
  }
}
