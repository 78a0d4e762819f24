// Test harness: the real app with the migrations applied, on a temporary SQLite file, or (project
// `server-pg`) on a fresh PostgreSQL database of the server TEST_DATABASE_URL names.
import { createHash } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import type { Express } from 'express';
import { inject } from 'vitest';
import { boot, type Booted } from '../../server/boot';
import { loadConfig } from '../../server/config';
import type { Role } from '../../shared/api/common';
import { ensureDatabase } from '../helpers/postgres';

/** True in the `server-pg` project: every app runs on PostgreSQL. */
export const onPostgres = process.env.VARSMITH_TEST_DIALECT === 'postgres';

/** A temporary folder under /tmp/varsmith-*. */
export function tempDir(): string {
  return mkdtempSync(path.join('/tmp', 'varsmith-test-'));
}

/**
 * The database settings of a test app: the SQLite file, and on PostgreSQL a database of its own
 * (one per file path, so an app restarted on the same path finds its data again).
 * @param databasePath - SQLite file (its folder also keeps the generated JWT secret).
 * @returns `DATABASE_PATH`, and `DATABASE_URL` on PostgreSQL.
 */
export async function databaseEnv(databasePath: string): Promise<Record<string, string>> {
  if (!onPostgres) return { DATABASE_PATH: databasePath };
  const name = `${inject('pgDatabasePrefix')}${createHash('sha256').update(databasePath).digest('hex').slice(0, 16)}`;
  return { DATABASE_PATH: databasePath, DATABASE_URL: await ensureDatabase(process.env.TEST_DATABASE_URL as string, name) };
}

/**
 * Boots the app on a database.
 * @param databasePath - SQLite file (on PostgreSQL: the key of its database).
 * @param env - extra environment.
 * @returns the booted app.
 */
export async function startApp(databasePath = path.join(tempDir(), 'db.sqlite'), env: Record<string, string> = {}): Promise<Booted> {
  const config = loadConfig({ ...(await databaseEnv(databasePath)), LOG_LEVEL: 'silent', PUBLIC_URL: 'http://varsmith.test', ...env });
  return boot(config);
}

/** Demo e-mail per role. */
export const emailOf = (role: Role): string => `${role}@varsmith.test`;

/**
 * Signs in a demo account.
 * @param app - the app.
 * @param role - which demo account.
 * @returns the bearer token.
 */
export async function tokenFor(app: Express, role: Role): Promise<string> {
  const res = await request(app).post('/api/auth/login').send({ email: emailOf(role), password: 'varsmith-demo' });
  if (res.status !== 200) throw new Error(`login ${role}: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.token as string;
}

/**
 * Signs in all four demo accounts.
 * @param app - the app.
 * @returns tokens by role.
 */
export async function allTokens(app: Express): Promise<Record<Role, string>> {
  return {
    engineer: await tokenFor(app, 'engineer'), reviewer: await tokenFor(app, 'reviewer'),
    tester: await tokenFor(app, 'tester'), admin: await tokenFor(app, 'admin'),
  };
}

/** `Authorization` header value. */
export const bearer = (token: string): string => `Bearer ${token}`;
