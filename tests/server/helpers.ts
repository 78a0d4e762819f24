// Test harness: the real app on a temporary SQLite file with the migrations applied.
import { mkdtempSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import type { Express } from 'express';
import { boot, type Booted } from '../../server/boot';
import { loadConfig } from '../../server/config';
import type { Role } from '../../shared/api/common';

/** A temporary folder under /tmp/varsmith-*. */
export function tempDir(): string {
  return mkdtempSync(path.join('/tmp', 'varsmith-test-'));
}

/**
 * Boots the app on a database file.
 * @param databasePath - SQLite file.
 * @param env - extra environment.
 * @returns the booted app.
 */
export async function startApp(databasePath = path.join(tempDir(), 'db.sqlite'), env: Record<string, string> = {}): Promise<Booted> {
  const config = loadConfig({ DATABASE_PATH: databasePath, LOG_LEVEL: 'silent', PUBLIC_URL: 'http://varsmith.test', ...env });
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
