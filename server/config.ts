// Configuration, validated once at boot (STYLE habit 20). Every setting comes from the environment.
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { z } from 'zod';

const envSchema = z.object({
  PORT: z.coerce.number().int('must be an integer').min(0).max(65535).default(3000),
  HOST: z.string().default('0.0.0.0'),
  DATABASE_PATH: z.string().min(1).default('data/varsmith.sqlite'),
  DATABASE_URL: z.string().url('must be a postgres:// URL').optional(),
  JWT_SECRET: z.string().min(32, 'must be at least 32 characters').optional(),
  SMTP_URL: z.string().url('must be an smtp:// or smtps:// URL').optional(),
  MAIL_FROM: z.string().default('Varsmith <varsmith@localhost>'),
  PUBLIC_URL: z.string().url('must be a URL').default('http://localhost:3000'),
  LOGIN_MAX_FAILURES: z.coerce.number().int().positive().default(5),
  LOGIN_WINDOW_MS: z.coerce.number().int().positive().default(15 * 60 * 1000),
  LOG_LEVEL: z.enum(['silent', 'error', 'info']).default('info'),
});

/** The validated configuration. */
export interface Config {
  port: number;
  host: string;
  databasePath: string;
  databaseUrl: string | null;
  jwtSecret: string;
  smtpUrl: string | null;
  mailFrom: string;
  publicUrl: string;
  loginMaxFailures: number;
  loginWindowMs: number;
  logLevel: 'silent' | 'error' | 'info';
}

/** Thrown when the environment is invalid; the message names each variable and its rule. */
export class ConfigError extends Error {}

/**
 * Reads the JWT signing secret kept beside the database, creating it (256 random bits) on first start.
 * @param dataDir - folder of the database file.
 * @returns the secret.
 */
function persistedSecret(dataDir: string): string {
  const file = path.join(dataDir, 'jwt-secret');
  if (existsSync(file)) {
    const secret = readFileSync(file, 'utf8').trim();
    if (secret.length >= 32) return secret;
  }
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString('hex');
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}

/**
 * Validates the environment into a Config.
 * @param env - the variables (process.env by default).
 * @returns the configuration.
 */
export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`invalid configuration: ${lines.join('; ')}`);
  }
  const v = parsed.data;
  const databasePath = path.resolve(v.DATABASE_PATH);
  return {
    port: v.PORT,
    host: v.HOST,
    databasePath,
    databaseUrl: v.DATABASE_URL ?? null,
    jwtSecret: v.JWT_SECRET ?? persistedSecret(path.dirname(databasePath)),
    smtpUrl: v.SMTP_URL ?? null,
    mailFrom: v.MAIL_FROM,
    publicUrl: v.PUBLIC_URL.replace(/\/$/, ''),
    loginMaxFailures: v.LOGIN_MAX_FAILURES,
    loginWindowMs: v.LOGIN_WINDOW_MS,
    logLevel: v.LOG_LEVEL,
  };
}
