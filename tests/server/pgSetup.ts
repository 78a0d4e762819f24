// Global setup of the `server-pg` project: a name prefix for this run's databases on the server that
// TEST_DATABASE_URL names, and dropping them all at the end.
import { randomBytes } from 'node:crypto';
import type { TestProject } from 'vitest/node';
import { dropDatabases } from '../helpers/postgres';

declare module 'vitest' {
  export interface ProvidedContext {
    pgDatabasePrefix: string;
  }
}

/**
 * Provides the prefix; returns the teardown that drops the databases.
 * @param project - the vitest project.
 * @returns the teardown.
 */
export default function setup(project: TestProject): () => Promise<void> {
  const url = process.env.TEST_DATABASE_URL;
  if (!url) throw new Error('the server-pg project needs TEST_DATABASE_URL (bash scripts/pg-throwaway.sh -- npx vitest run --project server-pg)');
  const prefix = `vs_t_${randomBytes(4).toString('hex')}_`;
  project.provide('pgDatabasePrefix', prefix);
  return async () => {
    const dropped = await dropDatabases(url, prefix);
    process.stdout.write(`server-pg: dropped ${dropped} test database(s) ${prefix}*\n`);
  };
}
