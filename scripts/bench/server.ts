// Server figures on a temporary SQLite file: boot with demo seed, sign-in, save, submission
// (analysis + insert), 20 concurrent submissions, release build, bundle download. Prints numbers only.
import { mkdtempSync, readFileSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { boot } from '../../server/boot';
import { loadConfig } from '../../server/config';

const ms = (t0: bigint): number => Number(process.hrtime.bigint() - t0) / 1e6;
const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Runs the server bench. */
export async function run(): Promise<Record<string, unknown>> {
  const dir = mkdtempSync('/tmp/varsmith-bench-');
  let t0 = process.hrtime.bigint();
  const booted = await boot(loadConfig({ DATABASE_PATH: path.join(dir, 'db.sqlite'), LOG_LEVEL: 'silent' }));
  const bootWithSeedMs = ms(t0);
  const app = booted.app;
  try {
    const login = async (email: string) => (await request(app).post('/api/auth/login').send({ email, password: 'varsmith-demo' })).body.token as string;
    t0 = process.hrtime.bigint();
    const eng = await login('engineer@varsmith.test');
    const loginMs = ms(t0);
    const rev = await login('reviewer@varsmith.test');
    const example = JSON.parse(readFileSync('examples/sc3-bench-l-120v.json', 'utf8')) as Record<string, unknown>;
    const created = await request(app).post('/api/designs').set('Authorization', `Bearer ${eng}`).send({ design: { ...example, name: 'Bench timing unit' } });
    const id = created.body.id as number;
    let version = created.body.version as number;
    const saves: number[] = [];
    for (let i = 0; i < 10; i++) {
      t0 = process.hrtime.bigint();
      const r = await request(app).put(`/api/designs/${id}`).set('Authorization', `Bearer ${eng}`).send({ design: { ...example, name: 'Bench timing unit' }, baseVersion: version });
      saves.push(ms(t0));
      version = r.body.version;
    }
    const submits: number[] = [];
    let lastId = 0;
    for (let i = 0; i < 10; i++) {
      t0 = process.hrtime.bigint();
      const r = await request(app).post(`/api/designs/${id}/revisions`).set('Authorization', `Bearer ${eng}`).send({ summary: `bench ${i}` });
      submits.push(ms(t0));
      lastId = r.body.id;
    }
    t0 = process.hrtime.bigint();
    await Promise.all(Array.from({ length: 20 }, (_, i) => request(app).post(`/api/designs/${id}/revisions`).set('Authorization', `Bearer ${eng}`).send({ summary: `burst ${i}` })));
    const burst20Ms = ms(t0);
    const latest = (await request(app).get(`/api/designs/${id}/revisions`).set('Authorization', `Bearer ${eng}`)).body[0].id as number;
    lastId = latest;
    await request(app).post(`/api/revisions/${lastId}/reviews`).set('Authorization', `Bearer ${rev}`).send({ decision: 'approve' });
    t0 = process.hrtime.bigint();
    const rel = await request(app).post(`/api/revisions/${lastId}/release`).set('Authorization', `Bearer ${eng}`).send({ version: '1.0.0' });
    const releaseMs = ms(t0);
    t0 = process.hrtime.bigint();
    await request(app).get(`/api/releases/${rel.body.id}/bundle`).set('Authorization', `Bearer ${eng}`);
    const downloadMs = ms(t0);
    return {
      bootWithSeedMs: Math.round(bootWithSeedMs), loginMs: Math.round(loginMs), saveMedianMs: +median(saves).toFixed(1),
      submitMedianMs: +median(submits).toFixed(1), burst20SubmitsMs: Math.round(burst20Ms), releaseBuildMs: Math.round(releaseMs),
      bundleBytes: rel.body.sizeBytes, downloadMs: +downloadMs.toFixed(1),
    };
  } finally {
    await booted.close();
  }
}
