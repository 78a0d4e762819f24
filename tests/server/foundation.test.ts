// Edge behaviour of the API: validation, limits, rate limit, error shape, accounts, persistence.
import { existsSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Booted } from '../../server/boot';
import { bearer, onPostgres, startApp, tempDir, tokenFor } from './helpers';

let booted: Booted;
let admin: string;

beforeAll(async () => {
  booted = await startApp();
  admin = await tokenFor(booted.app, 'admin');
});
afterAll(async () => { await booted.close(); });

describe('edge', () => {
  it('answers health without credentials', async () => {
    const res = await request(booted.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok' });
  });

  it('sends a CSP that allows only the app itself', async () => {
    const res = await request(booted.app).get('/api/health');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/https?:/);
  });

  it('rejects malformed JSON with 400', async () => {
    const res = await request(booted.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email": "a@b.c", ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('malformed-json');
  });

  it('rejects wrong types with 400 naming each field', async () => {
    const res = await request(booted.app).post('/api/auth/login').send({ email: 42, password: ['x'] });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    const paths = res.body.error.fields.map((f: { path: string }) => f.path).sort();
    expect(paths).toEqual(['email', 'password']);
    expect(res.body.error.message).toContain('email');
  });

  it('names nested query and param paths', async () => {
    const res = await request(booted.app).get('/api/admin/audit?limit=abc&since=yesterday').set('Authorization', bearer(admin));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(['query.limit', 'query.since']);
    const bad = await request(booted.app).patch('/api/admin/users/-3').set('Authorization', bearer(admin)).send({ role: 'tester' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('params.id');
  });

  it('rejects a body over 1 MB with 413', async () => {
    const res = await request(booted.app).post('/api/analyze').set('Authorization', bearer(admin)).send({ design: { name: 'x'.repeat(1024 * 1024 + 10) } });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload-too-large');
  });

  it('answers unknown API paths with 404 in the error shape', async () => {
    const res = await request(booted.app).get('/api/nowhere');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not-found');
  });
});

describe('accounts', () => {
  it('creates an account, changes its role (audited) and disables it', async () => {
    const created = await request(booted.app).post('/api/admin/users').set('Authorization', bearer(admin))
      .send({ email: 'Nadia.Fenwick@varsmith.test', name: 'Nadia Fenwick', role: 'engineer', password: 'correct-horse-9' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ email: 'nadia.fenwick@varsmith.test', role: 'engineer', disabled: false });
    expect(created.body.passwordHash).toBeUndefined();
    const dup = await request(booted.app).post('/api/admin/users').set('Authorization', bearer(admin))
      .send({ email: 'nadia.fenwick@varsmith.test', name: 'Again', role: 'tester', password: 'correct-horse-9' });
    expect(dup.status).toBe(409);

    const login = await request(booted.app).post('/api/auth/login').send({ email: 'nadia.fenwick@varsmith.test', password: 'correct-horse-9' });
    expect(login.status).toBe(200);
    const own = login.body.token as string;
    expect((await request(booted.app).get('/api/designs').set('Authorization', bearer(own))).status).toBe(200);

    const changed = await request(booted.app).patch(`/api/admin/users/${created.body.id}`).set('Authorization', bearer(admin)).send({ role: 'tester' });
    expect(changed.status).toBe(200);
    expect(changed.body.role).toBe('tester');
    // The role is read from the database on every request: the old session is a tester now.
    expect((await request(booted.app).get('/api/designs').set('Authorization', bearer(own))).status).toBe(403);

    const audit = await request(booted.app).get(`/api/admin/audit?action=user.role-change&targetId=${created.body.id}`).set('Authorization', bearer(admin));
    expect(audit.status).toBe(200);
    expect(audit.body).toHaveLength(1);
    expect(audit.body[0].details).toEqual({ from: 'engineer', to: 'tester' });
    expect(audit.body[0].actor.label).toBe('admin@varsmith.test');

    expect((await request(booted.app).patch(`/api/admin/users/${created.body.id}`).set('Authorization', bearer(admin)).send({ disabled: true })).status).toBe(200);
    expect((await request(booted.app).get('/api/auth/me').set('Authorization', bearer(own))).status).toBe(401);
    expect((await request(booted.app).post('/api/auth/login').send({ email: 'nadia.fenwick@varsmith.test', password: 'correct-horse-9' })).status).toBe(401);
  });

  it('keeps the admin from locking themself out', async () => {
    const me = await request(booted.app).get('/api/auth/me').set('Authorization', bearer(admin));
    const res = await request(booted.app).patch(`/api/admin/users/${me.body.id}`).set('Authorization', bearer(admin)).send({ role: 'tester' });
    expect(res.status).toBe(409);
  });

  it('refuses an unknown field in a user change', async () => {
    const res = await request(booted.app).patch('/api/admin/users/1').set('Authorization', bearer(admin)).send({ passwordHash: 'x' });
    expect(res.status).toBe(400);
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 after repeated bad passwords, and a wrong password is 401 before that', async () => {
    const isolated = await startApp(undefined, { LOGIN_MAX_FAILURES: '5' });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 7; i++) {
        statuses.push((await request(isolated.app).post('/api/auth/login').send({ email: 'tester@varsmith.test', password: `wrong-${i}` })).status);
      }
      expect(statuses).toEqual([401, 401, 401, 401, 401, 429, 429]);
      const limited = await request(isolated.app).post('/api/auth/login').send({ email: 'tester@varsmith.test', password: 'varsmith-demo' });
      expect(limited.status).toBe(429);
      expect(limited.body.error.code).toBe('rate-limited');
    } finally {
      await isolated.close();
    }
  });
});

describe('persistence', () => {
  it(`keeps data across a restart${onPostgres ? '' : ' and recreates a deleted database file with the demo data'}`, async () => {
    const dir = tempDir();
    const file = path.join(dir, 'db.sqlite');
    let app = await startApp(file);
    expect(app.seeded).toBe(true);
    const adminToken = await tokenFor(app.app, 'admin');
    const made = await request(app.app).post('/api/admin/users').set('Authorization', bearer(adminToken))
      .send({ email: 'otto.quill@varsmith.test', name: 'Otto Quill', role: 'reviewer', password: 'long-enough-1' });
    expect(made.status).toBe(201);
    await app.close();

    app = await startApp(file);
    expect(app.seeded).toBe(false);
    expect((await request(app.app).post('/api/auth/login').send({ email: 'otto.quill@varsmith.test', password: 'long-enough-1' })).status).toBe(200);
    // The JWT secret was generated on first start and kept beside the database: old sessions still work.
    expect((await request(app.app).get('/api/auth/me').set('Authorization', bearer(adminToken))).status).toBe(200);
    expect(statSync(path.join(dir, 'jwt-secret')).mode & 0o077).toBe(0);
    await app.close();
    if (onPostgres) return; // the rest is about the SQLite file, its journal and pragmas

    for (const f of ['db.sqlite', 'db.sqlite-wal', 'db.sqlite-shm']) rmSync(path.join(dir, f), { force: true });
    app = await startApp(file);
    expect(app.seeded).toBe(true);
    expect(existsSync(file)).toBe(true);
    expect((await request(app.app).post('/api/auth/login').send({ email: 'otto.quill@varsmith.test', password: 'long-enough-1' })).status).toBe(401);
    expect((await request(app.app).post('/api/auth/login').send({ email: 'engineer@varsmith.test', password: 'varsmith-demo' })).status).toBe(200);
    const pragma = async (name: string) => (await app.ctx.db.sequelize.query(`PRAGMA ${name}`, { type: QueryTypes.SELECT }))[0] as Record<string, unknown>;
    expect(await pragma('journal_mode')).toEqual({ journal_mode: 'wal' });
    expect(await pragma('foreign_keys')).toEqual({ foreign_keys: 1 });
    await app.close();
  });
});
