// `GET /api/releases` under load with 100 releases, on SQLite and on PostgreSQL: the server runs as
// `npm start` does (its own process, here without the client), autocannon sends with 10 connections
// for 10 s per case as the demo tester. Cases: the default first page (no parameters) and all 100
// rows in one page. PostgreSQL: the server TEST_DATABASE_URL names, else a throwaway cluster from
// scripts/pg-throwaway.sh; skipped with the reason when neither is available. Besides req/s and
// latency, the CPU time the server process spent per request (Linux /proc; it moves less than req/s
// when other work shares the machine) and the load average before each case. Numbers only.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { boot } from '../../server/boot';
import { loadConfig } from '../../server/config';
import { insertReleases } from '../../tests/server/factories';
import { dropDatabases, ensureDatabase, startThrowawayCluster } from '../../tests/helpers/postgres';

/** Releases stored before the run. */
const RELEASES = 100;
/** autocannon connections and seconds per case. */
const CONNECTIONS = 10;
const DURATION_S = 10;

/**
 * CPU time a process has used so far (user + system), from /proc (Linux).
 * @param pid - process id.
 * @returns milliseconds, or null where /proc is missing.
 */
function cpuMs(pid: number): number | null {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100; // utime, stime in clock ticks (USER_HZ = 100 on Linux)
  } catch {
    return null;
  }
}

/**
 * Starts the server process on a database and waits until it listens.
 * @param env - database settings and JWT secret.
 * @returns the process and its base URL.
 */
function startServer(env: Record<string, string>): Promise<{ proc: ChildProcess; url: string }> {
  const proc = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, ...env, PORT: '0', HOST: '127.0.0.1', VARSMITH_NO_CLIENT: '1', LOG_LEVEL: 'error' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  return new Promise((resolve, reject) => {
    let out = '';
    proc.stdout!.on('data', (c: Buffer) => {
      out += c.toString();
      const m = /listening on http:\/\/localhost:(\d+)/.exec(out);
      if (m) resolve({ proc, url: `http://127.0.0.1:${m[1]}` });
    });
    proc.stderr!.on('data', (c: Buffer) => { out += c.toString(); });
    proc.once('exit', (code) => reject(new Error(`server exited ${code}: ${out}`)));
  });
}

/**
 * Seeds the database with the demo data and the releases, then measures the server process on it.
 * @param env - `DATABASE_PATH` and, for PostgreSQL, `DATABASE_URL`.
 * @returns the figures of each case.
 */
async function measure(env: Record<string, string>): Promise<Record<string, unknown>> {
  const secret = randomBytes(32).toString('hex');
  const seeded = await boot(loadConfig({ ...env, JWT_SECRET: secret, LOG_LEVEL: 'silent' }));
  try {
    await insertReleases(seeded.ctx, 'Load Rack 100', RELEASES);
  } finally {
    await seeded.close();
  }
  const server = await startServer({ ...env, JWT_SECRET: secret });
  try {
    const login = await fetch(`${server.url}/api/auth/login`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'tester@varsmith.test', password: 'varsmith-demo' }),
    });
    const token = ((await login.json()) as { token: string }).token;
    const headers = { authorization: `Bearer ${token}` };
    const out: Record<string, unknown> = {};
    for (const [name, query] of [['defaultPage', ''], ['all100', `?limit=${RELEASES}`]] as const) {
      const probe = await fetch(`${server.url}/api/releases${query}`, { headers });
      const rows = ((await probe.json()) as unknown[]).length;
      await autocannon({ url: `${server.url}/api/releases${query}`, connections: CONNECTIONS, duration: 2, headers }); // warm-up
      const load1m = loadavg()[0];
      const cpu0 = cpuMs(server.proc.pid!);
      const r = await autocannon({ url: `${server.url}/api/releases${query}`, connections: CONNECTIONS, duration: DURATION_S, headers });
      const cpu1 = cpuMs(server.proc.pid!);
      out[name] = {
        rows, totalHeader: Number(probe.headers.get('x-total-count')), bytes: Number(probe.headers.get('content-length')),
        requestsPerS: Math.round(r.requests.average), latencyP50Ms: r.latency.p50, latencyP99Ms: r.latency.p99,
        non2xx: r.non2xx, errors: r.errors + r.timeouts,
        serverCpuMsPerRequest: cpu0 === null || cpu1 === null ? null : +((cpu1 - cpu0) / Math.max(1, r['2xx'] + r.non2xx)).toFixed(2),
        loadAverage1m: +load1m.toFixed(2),
      };
    }
    return out;
  } finally {
    server.proc.kill('SIGTERM');
    await new Promise((r) => (server.proc.exitCode !== null ? r(null) : server.proc.once('exit', r)));
  }
}

/** Runs the list bench. */
export async function run(): Promise<Record<string, unknown>> {
  const result: Record<string, unknown> = { releases: RELEASES, connections: CONNECTIONS, durationS: DURATION_S, target: '>= 300 req/s, p99 < 100 ms' };
  result.sqlite = await measure({ DATABASE_PATH: path.join(mkdtempSync('/tmp/varsmith-bench-'), 'db.sqlite') });
  let serverUrl = process.env.TEST_DATABASE_URL ?? null;
  let stop = async () => {};
  if (serverUrl === null) {
    const cluster = await startThrowawayCluster();
    if ('skipped' in cluster) {
      result.postgres = { skipped: cluster.skipped };
      process.stderr.write(`bench lists: PostgreSQL skipped: ${cluster.skipped}\n`);
      return result;
    }
    serverUrl = cluster.url;
    stop = cluster.stop;
  }
  const prefix = `vs_bench_${randomBytes(4).toString('hex')}`;
  try {
    const url = await ensureDatabase(serverUrl, prefix);
    result.postgres = await measure({ DATABASE_PATH: path.join(mkdtempSync('/tmp/varsmith-bench-'), 'unused.sqlite'), DATABASE_URL: url });
  } finally {
    await dropDatabases(serverUrl, prefix).catch(() => 0);
    await stop();
  }
  return result;
}
