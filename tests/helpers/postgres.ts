// PostgreSQL for the server tests and the bench: one fresh database per booted app on the server that
// TEST_DATABASE_URL names (a maintenance database such as `postgres`, e.g. the throwaway cluster of
// scripts/pg-throwaway.sh), and that throwaway cluster started from Node when no server is given.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { QueryTypes, Sequelize } from 'sequelize';

/**
 * The URL of another database on the same server.
 * @param serverUrl - a connection URL of the server (any database).
 * @param database - database name.
 * @returns the URL naming `database`.
 */
export function databaseUrl(serverUrl: string, database: string): string {
  const url = new URL(serverUrl);
  url.pathname = `/${database}`;
  return url.toString();
}

/**
 * Runs one statement on the server's maintenance connection.
 * @param serverUrl - a connection URL of the server.
 * @param sql - the statement.
 * @param values - its parameters.
 * @returns the rows.
 */
export async function adminQuery(serverUrl: string, sql: string, values: unknown[] = []): Promise<Record<string, unknown>[]> {
  const client = new Sequelize(serverUrl, { logging: false, pool: { max: 1, min: 0 } });
  try {
    return await client.query<Record<string, unknown>>(sql, { bind: values, type: QueryTypes.SELECT });
  } finally {
    await client.close();
  }
}

/**
 * Creates a database unless it exists (callers racing for one name all get it).
 * @param serverUrl - a connection URL of the server.
 * @param name - database name (letters, digits and `_` only).
 * @returns the URL of the database.
 */
export async function ensureDatabase(serverUrl: string, name: string): Promise<string> {
  if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`unsafe database name ${name}`);
  const found = await adminQuery(serverUrl, 'SELECT 1 FROM pg_database WHERE datname = $1', [name]);
  if (found.length === 0) {
    // 42P04 duplicate_database, 23505 unique_violation on pg_database: another caller created it meanwhile.
    await adminQuery(serverUrl, `CREATE DATABASE ${name}`).catch((err: { original?: { code?: string } }) => {
      if (err.original?.code !== '42P04' && err.original?.code !== '23505') throw err;
    });
  }
  return databaseUrl(serverUrl, name);
}

/**
 * Drops every database whose name starts with a prefix (closing their connections).
 * @param serverUrl - a connection URL of the server.
 * @param prefix - name prefix (letters, digits and `_` only).
 * @returns how many were dropped.
 */
export async function dropDatabases(serverUrl: string, prefix: string): Promise<number> {
  if (!/^[a-z0-9_]+$/.test(prefix)) throw new Error(`unsafe database prefix ${prefix}`);
  const rows = await adminQuery(serverUrl, "SELECT datname FROM pg_database WHERE datname LIKE $1 || '%'", [prefix]);
  for (const row of rows) await adminQuery(serverUrl, `DROP DATABASE ${String(row.datname)} WITH (FORCE)`);
  return rows.length;
}

/** A throwaway cluster started by scripts/pg-throwaway.sh. */
export interface ThrowawayCluster {
  url: string;
  stop(): Promise<void>;
}

/**
 * Starts scripts/pg-throwaway.sh in its serving mode and waits for its URL.
 * @returns the cluster, or a reason when PostgreSQL's binaries are missing or it failed to start.
 */
export function startThrowawayCluster(): Promise<ThrowawayCluster | { skipped: string }> {
  const script = path.resolve('scripts/pg-throwaway.sh');
  const child: ChildProcess = spawn('bash', [script], { stdio: ['ignore', 'pipe', 'pipe'] });
  let err = '';
  let out = '';
  return new Promise((resolve) => {
    child.stderr!.on('data', (c: Buffer) => { err += c.toString(); });
    child.stdout!.on('data', (c: Buffer) => {
      out += c.toString();
      const m = /^TEST_DATABASE_URL=(\S+)$/m.exec(out);
      if (!m) return;
      const stop = () => new Promise<void>((done) => {
        if (child.exitCode !== null) return done();
        child.once('exit', () => done());
        child.kill('SIGTERM');
      });
      resolve({ url: m[1], stop });
    });
    child.once('exit', (code) => resolve({ skipped: `scripts/pg-throwaway.sh exited ${code}: ${err.trim().split('\n').pop() ?? ''}` }));
  });
}
