// `GET /api/releases` under load with 100 releases, on SQLite and on PostgreSQL: the server runs as
// `npm start` does (its own process, here without the client), autocannon sends with 10 connections
// for 10 s per case as the demo tester. Cases: the default first page (no parameters) and all 100
// rows in one page. PostgreSQL: the server TEST_DATABASE_URL names, else a throwaway cluster from
// scripts/pg-throwaway.sh; skipped with the reason when neither is available. Besides req/s and
// latency, the CPU time the server process spent per request (Linux /proc; it moves less than req/s
// when other work shares the machine) and the load average before each case. Numbers only.
import { randomBytes } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import { loadavg } from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { boot } from '../../server/boot';
import { loadConfig } from '../../server/config';
import { insertReleases } from '../../tests/server/factories';
import { cpuMs, signIn, startServerProcess, withPostgres } from '../lib/serverProcess';

/** Releases stored before the run. */
const RELEASES = 100;
/** autocannon connections and seconds per case. */
const CONNECTIONS = 10;
const DURATION_S = 10;

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
  const server = await startServerProcess({ ...env, JWT_SECRET: secret });
  try {
    const token = await signIn(server.url, 'tester@varsmith.test');
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
    await server.stop();
  }
}

/** Runs the list bench. */
export async function run(): Promise<Record<string, unknown>> {
  const result: Record<string, unknown> = { releases: RELEASES, connections: CONNECTIONS, durationS: DURATION_S, target: '>= 300 req/s, p99 < 100 ms' };
  result.sqlite = await measure({ DATABASE_PATH: path.join(mkdtempSync('/tmp/varsmith-bench-'), 'db.sqlite') });
  result.postgres = await withPostgres((url) => measure({ DATABASE_PATH: path.join(mkdtempSync('/tmp/varsmith-bench-'), 'unused.sqlite'), DATABASE_URL: url }));
  if ('skipped' in (result.postgres as object)) process.stderr.write(`bench lists: PostgreSQL skipped: ${(result.postgres as { skipped: string }).skipped}\n`);
  return result;
}
