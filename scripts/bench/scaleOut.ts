// Two server processes on one database (SQLite file, then PostgreSQL), requests alternating between
// them as a round-robin proxy would: 40 concurrent submissions on one design, then ten concurrent
// releases of its newest revision under one version. Prints the answers counted by status, whether
// the numbers are exactly 1..40, and the times. PostgreSQL as in the list bench. Numbers only.
import { randomBytes } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import path from 'node:path';
import { boot } from '../../server/boot';
import { loadConfig } from '../../server/config';
import { contractExampleDesign } from '../../shared/api/designExample';
import { signIn, startServerProcess, withPostgres, type ServerProcess } from '../lib/serverProcess';

/** Concurrent submissions and releases. */
const SUBMISSIONS = 40;
const RELEASES = 10;

const tally = (statuses: number[]) => statuses.reduce<Record<number, number>>((t, s) => ({ ...t, [s]: (t[s] ?? 0) + 1 }), {});

/**
 * One JSON request.
 * @param url - full URL.
 * @param token - bearer token.
 * @param body - JSON body.
 * @returns status and parsed body.
 */
async function post(url: string, token: string, body: unknown): Promise<{ status: number; body: Record<string, unknown> }> {
  const res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` }, body: JSON.stringify(body) });
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
}

/**
 * Seeds the database, starts two server processes on it and sends the bursts.
 * @param env - `DATABASE_PATH` and, for PostgreSQL, `DATABASE_URL`.
 * @returns the figures.
 */
async function measure(env: Record<string, string>): Promise<Record<string, unknown>> {
  const secret = randomBytes(32).toString('hex');
  await (await boot(loadConfig({ ...env, JWT_SECRET: secret, LOG_LEVEL: 'silent' }))).close();
  const servers: ServerProcess[] = [];
  try {
    servers.push(await startServerProcess({ ...env, JWT_SECRET: secret }), await startServerProcess({ ...env, JWT_SECRET: secret }));
    const urls = servers.map((s) => s.url);
    const engineer = await signIn(urls[0], 'engineer@varsmith.test');
    const reviewer = await signIn(urls[1], 'reviewer@varsmith.test');
    const design = await post(`${urls[0]}/api/designs`, engineer, { design: contractExampleDesign('Two-process unit') });
    const id = design.body.id as number;
    let t0 = performance.now();
    const submitted = await Promise.all(Array.from({ length: SUBMISSIONS }, (_, i) =>
      post(`${urls[i % 2]}/api/designs/${id}/revisions`, engineer, { summary: `burst ${i}` })));
    const submitMs = performance.now() - t0;
    const numbers = submitted.filter((r) => r.status === 201).map((r) => r.body.number as number).sort((a, b) => a - b);
    const newest = submitted.find((r) => r.body.number === SUBMISSIONS);
    let releases: Record<string, unknown> = { skipped: 'no revision numbered 40' };
    if (newest) {
      await post(`${urls[1]}/api/revisions/${newest.body.id as number}/reviews`, reviewer, { decision: 'approve' });
      t0 = performance.now();
      const released = await Promise.all(Array.from({ length: RELEASES }, (_, i) =>
        post(`${urls[i % 2]}/api/revisions/${newest.body.id as number}/release`, engineer, { version: '1.0.0' })));
      releases = { requests: RELEASES, statuses: tally(released.map((r) => r.status)), elapsedMs: Math.round(performance.now() - t0) };
    }
    return {
      submissions: {
        requests: SUBMISSIONS, statuses: tally(submitted.map((r) => r.status)),
        numbersAre1ToN: numbers.length === SUBMISSIONS && numbers.every((n, i) => n === i + 1), elapsedMs: Math.round(submitMs),
      },
      releases,
    };
  } finally {
    await Promise.all(servers.map((s) => s.stop()));
  }
}

/** Runs the two-process bench. */
export async function run(): Promise<Record<string, unknown>> {
  const sqlite = await measure({ DATABASE_PATH: path.join(mkdtempSync('/tmp/varsmith-bench-'), 'db.sqlite') });
  const postgres = await withPostgres((url) => measure({ DATABASE_PATH: path.join(mkdtempSync('/tmp/varsmith-bench-'), 'unused.sqlite'), DATABASE_URL: url }));
  if ('skipped' in postgres) process.stderr.write(`bench scaleOut: PostgreSQL skipped: ${postgres.skipped as string}\n`);
  return { processes: 2, sqlite, postgres };
}
