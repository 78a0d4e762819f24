// Helpers of the server benches: the server as its own process (as `npm start` runs it, without the
// client), its CPU time, and a PostgreSQL database for one bench (the server TEST_DATABASE_URL names,
// else a throwaway cluster from scripts/pg-throwaway.sh; a reason when neither is available).
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { dropDatabases, ensureDatabase, startThrowawayCluster } from '../../tests/helpers/postgres';

/** A running server process. */
export interface ServerProcess {
  proc: ChildProcess;
  url: string;
  stop(): Promise<void>;
}

/**
 * Starts `server/index.ts` in its own Node process on a free port and waits until it listens.
 * @param env - database settings, JWT secret and anything else.
 * @returns the process and its base URL.
 */
export function startServerProcess(env: Record<string, string>): Promise<ServerProcess> {
  const proc = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, ...env, PORT: '0', HOST: '127.0.0.1', VARSMITH_NO_CLIENT: '1', LOG_LEVEL: 'error' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const stop = () => new Promise<void>((done) => {
    if (proc.exitCode !== null || proc.signalCode !== null) return done();
    proc.once('exit', () => done());
    proc.kill('SIGTERM');
  });
  return new Promise((resolve, reject) => {
    let out = '';
    proc.stdout!.on('data', (c: Buffer) => {
      out += c.toString();
      const m = /listening on http:\/\/localhost:(\d+)/.exec(out);
      if (m) resolve({ proc, url: `http://127.0.0.1:${m[1]}`, stop });
    });
    proc.stderr!.on('data', (c: Buffer) => { out += c.toString(); });
    proc.once('exit', (code) => reject(new Error(`server exited ${code}: ${out}`)));
  });
}

/**
 * CPU time a process has used so far (user + system), from /proc (Linux).
 * @param pid - process id.
 * @returns milliseconds, or null where /proc is missing.
 */
export function cpuMs(pid: number): number | null {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100; // utime, stime in clock ticks (USER_HZ = 100 on Linux)
  } catch {
    return null;
  }
}

/**
 * Signs in a demo account.
 * @param url - server base URL.
 * @param email - demo e-mail.
 * @returns the bearer token.
 */
export async function signIn(url: string, email: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: 'varsmith-demo' }),
  });
  return ((await res.json()) as { token: string }).token;
}

/**
 * Runs `work` with the URL of a fresh PostgreSQL database, dropped afterwards.
 * @param work - what to run.
 * @returns its result, or `{ skipped }` naming why PostgreSQL was not available.
 */
export async function withPostgres<T>(work: (databaseUrl: string) => Promise<T>): Promise<T | { skipped: string }> {
  let serverUrl = process.env.TEST_DATABASE_URL ?? null;
  let stop = async () => {};
  if (serverUrl === null) {
    const cluster = await startThrowawayCluster();
    if ('skipped' in cluster) return { skipped: cluster.skipped };
    serverUrl = cluster.url;
    stop = cluster.stop;
  }
  const name = `vs_bench_${randomBytes(4).toString('hex')}`;
  try {
    return await work(await ensureDatabase(serverUrl, name));
  } finally {
    await dropDatabases(serverUrl, name).catch(() => 0);
    await stop();
  }
}
