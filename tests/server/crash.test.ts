// Kill the server process (SIGKILL) during a burst of writes, restart on the same database: every
// acknowledged revision is there and intact, and (SQLite) the file passes its integrity check.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { afterAll, expect, it } from 'vitest';
import { buildDesign } from './factories';
import { bearer, databaseEnv, onPostgres, startApp, tempDir } from './helpers';

let child: ChildProcess | null = null;
afterAll(() => { if (child && child.exitCode === null) child.kill('SIGKILL'); });

async function startChild(databasePath: string): Promise<{ proc: ChildProcess; url: string }> {
  const proc = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, ...(await databaseEnv(databasePath)), PORT: '0', HOST: '127.0.0.1', VARSMITH_NO_CLIENT: '1', LOG_LEVEL: 'error' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  return new Promise((resolve, reject) => {
    let out = '';
    proc.stdout!.on('data', (c: Buffer) => {
      out += c.toString();
      const m = /listening on (http:\/\/localhost:\d+)/.exec(out);
      if (m) resolve({ proc, url: m[1].replace('localhost', '127.0.0.1') });
    });
    proc.stderr!.on('data', (c: Buffer) => { out += c.toString(); });
    proc.once('exit', (code) => reject(new Error(`server exited ${code}: ${out}`)));
  });
}

async function post(url: string, token: string | null, body: unknown): Promise<{ status: number; body: Record<string, unknown> }> {
  const res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json', ...(token ? { authorization: bearer(token) } : {}) }, body: JSON.stringify(body) });
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
}

it('keeps every acknowledged revision after a SIGKILL mid-burst', async () => {
  const file = path.join(tempDir(), 'db.sqlite');
  const started = await startChild(file);
  child = started.proc;
  const login = await post(`${started.url}/api/auth/login`, null, { email: 'engineer@varsmith.test', password: 'varsmith-demo' });
  const token = login.body.token as string;
  const design = await post(`${started.url}/api/designs`, token, { design: buildDesign({ name: 'Crash unit' }) });
  expect(design.status).toBe(201);
  const designId = design.body.id as number;

  const acknowledged: { id: number; number: number; summary: string }[] = [];
  let killed = false;
  const worker = async (w: number) => {
    for (let i = 0; !killed; i++) {
      try {
        const summary = `w${w}-${i}`;
        const r = await post(`${started.url}/api/designs/${designId}/revisions`, token, { summary });
        if (r.status === 201) acknowledged.push({ id: r.body.id as number, number: r.body.number as number, summary });
        if (acknowledged.length >= 25 && !killed) {
          killed = true;
          started.proc.kill('SIGKILL');
        }
      } catch {
        return; // connection refused or reset: the process is gone
      }
    }
  };
  await Promise.all(Array.from({ length: 6 }, (_, w) => worker(w)));
  await new Promise((r) => (started.proc.exitCode !== null || started.proc.signalCode !== null ? r(null) : started.proc.once('exit', r)));
  expect(killed).toBe(true);

  const restarted = await startApp(file);
  try {
    expect(restarted.seeded).toBe(false);
    if (!onPostgres) {
      const [check] = await restarted.ctx.db.sequelize.query('PRAGMA integrity_check', { type: QueryTypes.SELECT });
      expect(check).toEqual({ integrity_check: 'ok' });
    }
    const engineer = (await request(restarted.app).post('/api/auth/login').send({ email: 'engineer@varsmith.test', password: 'varsmith-demo' })).body.token as string;
    const listed = await request(restarted.app).get(`/api/designs/${designId}/revisions`).set('Authorization', bearer(engineer));
    const stored = new Map<number, { number: number; summary: string }>(listed.body.map((r: { id: number; number: number; summary: string }) => [r.id, r]));
    for (const ack of acknowledged) expect(stored.get(ack.id)).toMatchObject({ number: ack.number, summary: ack.summary });
    const numbers = [...stored.values()].map((r) => r.number).sort((a, b) => a - b);
    expect(numbers).toEqual(Array.from({ length: numbers.length }, (_, i) => i + 1));
    for (const ack of acknowledged.slice(0, 3)) {
      const full = await request(restarted.app).get(`/api/revisions/${ack.id}`).set('Authorization', bearer(engineer));
      expect(full.body.analysis.format).toBe('varsmith-analysis/1');
      expect(full.body.design.name).toBe('Crash unit');
    }
  } finally {
    await restarted.close();
  }
}, 120_000);
