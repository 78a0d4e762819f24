// Two app instances on one database, each with its own connection pool — what two server processes
// behind one proxy are (SQLite file in the `server` project, PostgreSQL in `server-pg`). Requests
// arrive at both at once: revision numbers, release versions and withdrawals stay exact, and the
// database itself refuses any change to released bytes, whichever instance's connection sends it.
import { createHash, randomBytes } from 'node:crypto';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Booted } from '../../server/boot';
import { buildDesign } from './factories';
import { bearer, onPostgres, startApp, tempDir, tokenFor } from './helpers';

/** Statuses of responses, counted: `{ 201: 1, 409: 9 }`. */
const tally = (statuses: number[]) => statuses.reduce<Record<number, number>>((t, s) => ({ ...t, [s]: (t[s] ?? 0) + 1 }), {});
const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

let instances: [Booted, Booted];
const t: { engineer: string; reviewer: string; admin: string } = {} as never;
/** The instance that serves request `i` (alternating, as a round-robin proxy would). */
const via = (i: number) => request(instances[i % 2].app);

beforeAll(async () => {
  const file = path.join(tempDir(), 'db.sqlite');
  const env = { JWT_SECRET: randomBytes(32).toString('hex') };
  // PostgreSQL: both start at once, and the start-up lock lets one migrate and seed. SQLite: one after the other.
  instances = onPostgres
    ? await Promise.all([startApp(file, env), startApp(file, env)])
    : [await startApp(file, env), await startApp(file, env)];
  t.engineer = await tokenFor(instances[0].app, 'engineer');
  t.reviewer = await tokenFor(instances[1].app, 'reviewer');
  t.admin = await tokenFor(instances[0].app, 'admin');
});
afterAll(async () => { await Promise.all(instances.map((b) => b.close())); });

describe.sequential('two app instances on one database', () => {
  const s: { designId: number; latestId: number; releaseId: number; sha: string } = {} as never;

  it('seeds the demo data once, and sessions signed by one instance work on the other', async () => {
    expect(instances.filter((b) => b.seeded)).toHaveLength(1);
    expect((await request(instances[1].app).get('/api/auth/me').set('Authorization', bearer(t.engineer))).status).toBe(200);
  });

  it('numbers 40 concurrent submissions 1..40, every one 201; only the newest stays in review', async () => {
    const created = await via(0).post('/api/designs').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ name: 'Two-instance unit' }) });
    expect(created.status).toBe(201);
    s.designId = created.body.id;
    const results = await Promise.all(Array.from({ length: 40 }, (_, i) =>
      via(i).post(`/api/designs/${s.designId}/revisions`).set('Authorization', bearer(t.engineer)).send({ summary: `burst ${i}` })));
    expect(tally(results.map((r) => r.status))).toEqual({ 201: 40 });
    expect(results.map((r) => r.body.number as number).sort((a, b) => a - b)).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
    const listed = await via(1).get(`/api/designs/${s.designId}/revisions?limit=200`).set('Authorization', bearer(t.reviewer));
    expect(listed.headers['x-total-count']).toBe('40');
    expect(listed.body.map((r: { number: number }) => r.number)).toEqual(Array.from({ length: 40 }, (_, i) => 40 - i));
    expect(listed.body.filter((r: { status: string }) => r.status === 'in-review').map((r: { number: number }) => r.number)).toEqual([40]);
    expect(listed.body.filter((r: { status: string }) => r.status === 'superseded')).toHaveLength(39);
    s.latestId = listed.body[0].id;
    const audit = await via(0).get(`/api/admin/audit?action=revision.submit&limit=1000`).set('Authorization', bearer(t.admin));
    expect(audit.body.filter((e: { details: { designId: number } }) => e.details.designId === s.designId)).toHaveLength(40);
  });

  it('of ten concurrent releases under one version, one wins and nine get 409', async () => {
    expect((await via(1).post(`/api/revisions/${s.latestId}/reviews`).set('Authorization', bearer(t.reviewer)).send({ decision: 'approve' })).status).toBe(201);
    const results = await Promise.all(Array.from({ length: 10 }, (_, i) =>
      via(i).post(`/api/revisions/${s.latestId}/release`).set('Authorization', bearer(i % 2 === 0 ? t.engineer : t.admin)).send({ version: '1.0.0' })));
    expect(tally(results.map((r) => r.status))).toEqual({ 201: 1, 409: 9 });
    for (const lost of results.filter((r) => r.status === 409)) expect(['not-approved', 'version-taken']).toContain(lost.body.error.code);
    const won = results.find((r) => r.status === 201)!;
    s.releaseId = won.body.id;
    s.sha = won.body.sha256;
    const listed = await via(1).get(`/api/releases?designId=${s.designId}`).set('Authorization', bearer(t.engineer));
    expect(listed.body.map((r: { id: number }) => r.id)).toEqual([s.releaseId]);
    const audit = await via(0).get('/api/admin/audit?action=release.create').set('Authorization', bearer(t.admin));
    expect(audit.body.filter((e: { targetId: number }) => e.targetId === s.releaseId)).toHaveLength(1);
    expect(audit.body.filter((e: { details: { designId: number } }) => e.details.designId === s.designId)).toHaveLength(1);
  });

  it('of four concurrent withdrawals, one is recorded and three get 409', async () => {
    const results = await Promise.all(Array.from({ length: 4 }, (_, i) =>
      via(i).post(`/api/releases/${s.releaseId}/withdraw`).set('Authorization', bearer(t.engineer)).send({ reason: `bench finding ${i}` })));
    expect(tally(results.map((r) => r.status))).toEqual({ 200: 1, 409: 3 });
    const audit = await via(1).get(`/api/admin/audit?action=release.withdraw&targetId=${s.releaseId}`).set('Authorization', bearer(t.admin));
    expect(audit.body).toHaveLength(1);
    expect(audit.body[0].details.reason).toBe(results.find((r) => r.status === 200)!.body.withdrawnReason);
  });

  it("refuses changing or deleting the released bytes by SQL through either instance's connection", async () => {
    const byte = onPostgres ? "'\\x00'::bytea" : "x'00'";
    const refusal = (b: Booted, sql: string) => b.ctx.db.sequelize.query(sql).then(() => 'accepted', (e: { original?: Error; message: string }) => (e.original ?? e).message);
    for (const b of instances) {
      expect(await refusal(b, `UPDATE releases SET bundle = ${byte} WHERE id = ${s.releaseId}`)).toContain('released data never changes');
      expect(await refusal(b, `UPDATE releases SET sha256 = '${'0'.repeat(64)}' WHERE id = ${s.releaseId}`)).toContain('released data never changes');
      expect(await refusal(b, `DELETE FROM releases WHERE id = ${s.releaseId}`)).toContain('released data never changes');
      expect(await refusal(b, `UPDATE revisions SET status = 'approved' WHERE id = ${s.latestId}`)).toContain('released data never changes');
      if (onPostgres) expect(await refusal(b, 'TRUNCATE releases CASCADE')).toContain('released data never changes');
    }
    const bundle = await via(1).get(`/api/releases/${s.releaseId}/bundle`).set('Authorization', bearer(t.engineer)).buffer(true).parse(binary);
    expect(createHash('sha256').update(bundle.body).digest('hex')).toBe(s.sha);
  });
});
