// Every route × every role, by walking the route table: anonymous → 401, a role the route does
// not list → 403, a listed role gets past the guard; read-only tokens only on release reads.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { routeTable } from '../../server/app';
import { ROLES, type Role } from '../../shared/api/common';
import type { Booted } from '../../server/boot';
import { allTokens, bearer, startApp } from './helpers';

let booted: Booted;
let tokens: Record<Role, string>;
let accessToken: string;

beforeAll(async () => {
  booted = await startApp();
  tokens = await allTokens(booted.app);
  const created = await request(booted.app).post('/api/tokens').set('Authorization', bearer(tokens.tester)).send({ name: 'route walk' });
  expect(created.status).toBe(201);
  accessToken = created.body.secret;
});
afterAll(async () => { await booted.close(); });

const table = routeTable();
const concrete = (p: string) => `/api${p.replace(/:[a-z]+/g, '999')}`;
const call = (method: string, url: string) => (request(booted.app) as unknown as Record<string, (u: string) => request.Test>)[method](url);

describe('route table', () => {
  it('declares the routes of CONTRACT section 6', () => {
    const keys = table.map((r) => `${r.method.toUpperCase()} ${r.path}`);
    for (const k of ['GET /health', 'POST /auth/login', 'POST /analyze', 'GET /designs', 'POST /designs', 'GET /designs/:id', 'PUT /designs/:id',
      'POST /designs/:id/revisions', 'GET /designs/:id/revisions', 'GET /revisions/:id', 'GET /revisions/:a/diff/:b', 'POST /revisions/:id/reviews',
      'POST /revisions/:id/release', 'GET /releases', 'GET /releases/:id', 'GET /releases/:id/bundle', 'POST /tokens', 'GET /tokens', 'DELETE /tokens/:id',
      'GET /admin/users', 'POST /admin/users', 'PATCH /admin/users/:id', 'GET /admin/mail', 'GET /admin/audit']) expect(keys).toContain(k);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it('gives the contract roles to the contract routes', () => {
    const roles = (m: string, p: string) => table.find((r) => r.method === m && r.path === p)?.access;
    expect(roles('get', '/designs')).toEqual(['engineer', 'reviewer', 'admin']);
    expect(roles('post', '/designs')).toEqual(['engineer']);
    expect(roles('post', '/revisions/:id/reviews')).toEqual(['reviewer']);
    expect(roles('post', '/revisions/:id/release')).toEqual(['engineer', 'admin']);
    expect(roles('post', '/tokens')).toEqual(['tester', 'admin']);
    expect(roles('get', '/admin/audit')).toEqual(['admin']);
    expect(table.filter((r) => r.tokens).map((r) => r.path).sort()).toEqual(['/releases', '/releases/:id', '/releases/:id/bundle']);
  });
});

describe.each(table.filter((r) => r.access !== 'anyone').map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))('%s', (_name, r) => {
  const allowed = r.access as Role[];
  it('refuses anonymous callers with 401 and the error shape', async () => {
    const res = await call(r.method, concrete(r.path));
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthorized');
    expect(typeof res.body.error.message).toBe('string');
  });
  it('refuses a garbage bearer with 401', async () => {
    const res = await call(r.method, concrete(r.path)).set('Authorization', 'Bearer not-a-jwt');
    expect(res.status).toBe(401);
  });
  it.each(ROLES.map((role) => [role]))('role %s', async (role) => {
    const res = await call(r.method, concrete(r.path)).set('Authorization', bearer(tokens[role]));
    if (allowed.includes(role)) expect([401, 403]).not.toContain(res.status);
    else {
      expect(res.status).toBe(403);
      expect(res.body.error.message).toContain(role);
    }
  });
  it(r.tokens ? 'accepts a read-only token' : 'refuses a read-only token with 403', async () => {
    const res = await call(r.method, concrete(r.path)).set('Authorization', bearer(accessToken));
    if (r.tokens) expect([401, 403]).not.toContain(res.status);
    else expect(res.status).toBe(403);
  });
});

describe('bad input on every route', () => {
  const allowedToken = (r: (typeof table)[number]) => tokens[(r.access as Role[])[0]];
  it.each(table.filter((r) => r.schema.body !== undefined).map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))('%s: a body of wrong types is 400 naming fields', async (_n, r) => {
    let req = call(r.method, concrete(r.path).replace(/999/g, '1'));
    if (r.access !== 'anyone') req = req.set('Authorization', bearer(allowedToken(r)));
    const res = await req.send({ design: 7, email: 7, password: 7, summary: 7, decision: 7, version: 7, name: 7, role: 7, baseVersion: 'x', reason: 7, disabled: 'no' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.length).toBeGreaterThan(0);
    for (const f of res.body.error.fields) {
      expect(typeof f.path).toBe('string');
      expect(f.message.length).toBeGreaterThan(0);
    }
  });
  it.each(table.filter((r) => r.path.includes(':') && r.access !== 'anyone').map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))('%s: a non-numeric id is 400 naming the param', async (_n, r) => {
    const res = await call(r.method, `/api${r.path.replace(/:[a-z]+/g, 'abc')}`).set('Authorization', bearer(allowedToken(r))).send({});
    expect(res.status).toBe(400);
    expect(res.body.error.fields.some((f: { path: string }) => f.path.startsWith('params.'))).toBe(true);
  });
});
