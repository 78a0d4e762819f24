// The whole team walk on the real app and a real SQLite file: create, save, stale save, submit,
// refusals, four-eyes approval, release, duplicate version, downloads, token pull, diff, mail, audit.
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import { existsSync, readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { promisify } from 'node:util';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Booted } from '../../server/boot';
import type { Role } from '../../shared/api/common';
import { readZip } from '../export/helpers/unpack';
import { buildDesign } from './factories';
import { allTokens, bearer, onPostgres, startApp, tempDir } from './helpers';

const run = promisify(execFile);
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');
/** A one-byte blob literal in this database's SQL. */
const oneZeroByte = onPostgres ? "'\\x00'::bytea" : "x'00'";
const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

let booted: Booted;
let t: Record<Role, string>;
let listening: Server;
let baseUrl: string;
const dir = tempDir();
const s: { designId: number; version: number; rev1: number; rev2: number; releaseId: number; sha: string; token: string; tokenId: number } = {} as never;
const api = () => request(booted.app);

beforeAll(async () => {
  booted = await startApp(path.join(dir, 'db.sqlite'));
  t = await allTokens(booted.app);
  listening = booted.app.listen(0, '127.0.0.1');
  await new Promise((r) => listening.once('listening', r));
  baseUrl = `http://127.0.0.1:${(listening.address() as AddressInfo).port}`;
});
afterAll(async () => {
  await new Promise((r) => listening.close(r));
  await booted.close();
});

describe.sequential('team walk', () => {
  it('engineer creates a design; bad designs are refused naming the field', async () => {
    const bad = await api().post('/api/designs').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ filter: { topology: 'L', inductanceH: -1, resistanceOhm: 0.03 } }) });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.map((f: { path: string }) => f.path)).toContain('design.filter.inductanceH');
    const res = await api().post('/api/designs').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ name: 'Walk unit' }) });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Walk unit', version: 1, latestRevision: null, latestRelease: null, owner: { email: 'engineer@varsmith.test' } });
    s.designId = res.body.id;
    s.version = res.body.version;
    const dup = await api().post('/api/designs').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ name: 'Walk unit' }) });
    expect(dup.status).toBe(409);
  });

  it('saves with the current version, and a stale save is 409 with nothing written', async () => {
    const design = buildDesign({ name: 'Walk unit', reactiveFilter: { order: 2, cutoffHz: 8 } });
    const saved = await api().put(`/api/designs/${s.designId}`).set('Authorization', bearer(t.engineer)).send({ design, baseVersion: s.version });
    expect(saved.status).toBe(200);
    expect(saved.body.version).toBe(s.version + 1);
    const stale = await api().put(`/api/designs/${s.designId}`).set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ name: 'Walk unit' }), baseVersion: s.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale-version');
    expect(stale.body.error.details.currentVersion).toBe(s.version + 1);
    s.version += 1;
    // Nothing half-written: the refused save left no audit entry and no content change.
    const saves = await api().get(`/api/admin/audit?action=design.save&targetId=${s.designId}`).set('Authorization', bearer(t.admin));
    expect(saves.body).toHaveLength(1);
    const now = await api().get(`/api/designs/${s.designId}`).set('Authorization', bearer(t.engineer));
    expect(now.body.design.reactiveFilter.cutoffHz).toBe(8);
    expect(now.body.version).toBe(s.version);
  });

  it('submits revision 1 with the server-computed analysis; the tester is refused', async () => {
    const refused = await api().post(`/api/designs/${s.designId}/revisions`).set('Authorization', bearer(t.tester)).send({ summary: 'nope' });
    expect(refused.status).toBe(403);
    const empty = await api().post(`/api/designs/${s.designId}/revisions`).set('Authorization', bearer(t.engineer)).send({ summary: '' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields[0].path).toBe('summary');
    const res = await api().post(`/api/designs/${s.designId}/revisions`).set('Authorization', bearer(t.engineer)).send({ summary: 'Lower reactive cutoff' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ number: 1, status: 'in-review', summary: 'Lower reactive cutoff', reviews: [], release: null });
    expect(res.body.analysis.format).toBe('varsmith-analysis/1');
    expect(res.body.design.reactiveFilter.cutoffHz).toBe(8);
    s.rev1 = res.body.id;
    expect((await api().get(`/api/revisions/${s.rev1}`).set('Authorization', bearer(t.tester))).status).toBe(403);
  });

  it('refuses the author reviewing their own revision and releasing before approval', async () => {
    // The engineer is not a reviewer (403 by role); a reviewer who authored a revision is refused by the four-eyes rule below.
    expect((await api().post(`/api/revisions/${s.rev1}/reviews`).set('Authorization', bearer(t.engineer)).send({ decision: 'approve' })).status).toBe(403);
    const early = await api().post(`/api/revisions/${s.rev1}/release`).set('Authorization', bearer(t.engineer)).send({ version: '1.0.0' });
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe('not-approved');
  });

  it('refuses a reviewer deciding on a revision they authored (four-eyes)', async () => {
    const created = await api().post('/api/admin/users').set('Authorization', bearer(t.admin))
      .send({ email: 'dual.role@varsmith.test', name: 'Rafa Ostrowski', role: 'engineer', password: 'dual-role-pass' });
    const dual = (await api().post('/api/auth/login').send({ email: 'dual.role@varsmith.test', password: 'dual-role-pass' })).body.token as string;
    const d = await api().post('/api/designs').set('Authorization', bearer(dual)).send({ design: buildDesign({ name: 'Four eyes unit' }) });
    const r = await api().post(`/api/designs/${d.body.id}/revisions`).set('Authorization', bearer(dual)).send({ summary: 'mine' });
    expect(r.status).toBe(201);
    await api().patch(`/api/admin/users/${created.body.id}`).set('Authorization', bearer(t.admin)).send({ role: 'reviewer' });
    const own = await api().post(`/api/revisions/${r.body.id}/reviews`).set('Authorization', bearer(dual)).send({ decision: 'approve' });
    expect(own.status).toBe(403);
    expect(own.body.error.message).toContain('own revision');
  });

  it('the reviewer approves; a second decision is refused', async () => {
    const noComment = await api().post(`/api/revisions/${s.rev1}/reviews`).set('Authorization', bearer(t.reviewer)).send({ decision: 'changes' });
    expect(noComment.status).toBe(400);
    expect(noComment.body.error.fields[0].path).toBe('comment');
    const res = await api().post(`/api/revisions/${s.rev1}/reviews`).set('Authorization', bearer(t.reviewer)).send({ decision: 'approve', comment: 'Margins fine.' });
    expect(res.status).toBe(201);
    expect(res.body.status).toBe('approved');
    expect(res.body.reviews).toHaveLength(1);
    expect(res.body.reviews[0]).toMatchObject({ decision: 'approve', comment: 'Margins fine.', reviewer: { email: 'reviewer@varsmith.test' } });
    expect((await api().post(`/api/revisions/${s.rev1}/reviews`).set('Authorization', bearer(t.reviewer)).send({ decision: 'approve' })).status).toBe(409);
  });

  it('releases 1.0.0 once; bad and duplicate versions are refused', async () => {
    const bad = await api().post(`/api/revisions/${s.rev1}/release`).set('Authorization', bearer(t.engineer)).send({ version: 'v1' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('version');
    const errors = (await api().get(`/api/revisions/${s.rev1}`).set('Authorization', bearer(t.engineer))).body.analysis.checks.filter((c: { severity: string }) => c.severity === 'error');
    const res = await api().post(`/api/revisions/${s.rev1}/release`).set('Authorization', bearer(t.engineer)).send({ version: '1.0.0' });
    if (errors.length > 0) {
      expect(res.status).toBe(422);
      return;
    }
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ version: '1.0.0', revisionNumber: 1, designName: 'Walk unit', withdrawnAt: null });
    expect(res.body.sha256).toMatch(/^[0-9a-f]{64}$/);
    s.releaseId = res.body.id;
    s.sha = res.body.sha256;
    const dup = await api().post(`/api/revisions/${s.rev1}/release`).set('Authorization', bearer(t.admin)).send({ version: '1.0.0' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe('not-approved'); // a released revision is never released again
    const created = await api().get('/api/admin/audit?action=release.create').set('Authorization', bearer(t.admin));
    expect(created.body.filter((e: { targetId: number }) => e.targetId === s.releaseId)).toHaveLength(1);
    expect((await api().get('/api/releases?design=Walk%20unit').set('Authorization', bearer(t.tester))).body).toHaveLength(1);
    expect((await api().get(`/api/revisions/${s.rev1}`).set('Authorization', bearer(t.engineer))).body.status).toBe('released');
  });

  it('downloads twice byte-identical with the recorded SHA-256; the database refuses changing the bytes', async () => {
    const a = await api().get(`/api/releases/${s.releaseId}/bundle`).set('Authorization', bearer(t.tester)).buffer(true).parse(binary);
    const b = await api().get(`/api/releases/${s.releaseId}/bundle`).set('Authorization', bearer(t.tester)).buffer(true).parse(binary);
    expect(a.status).toBe(200);
    expect(a.headers['content-type']).toBe('application/zip');
    expect(Buffer.compare(a.body, b.body)).toBe(0);
    expect(sha256(a.body)).toBe(s.sha);
    expect(a.headers['x-content-sha256']).toBe(s.sha);
    const refusal = (sql: string) => booted.ctx.db.sequelize.query(sql).then(() => 'accepted', (e: { original?: Error; message: string }) => (e.original ?? e).message);
    expect(await refusal(`UPDATE releases SET bundle = ${oneZeroByte} WHERE id = ${s.releaseId}`)).toContain('released data never changes');
    expect(await refusal(`DELETE FROM releases WHERE id = ${s.releaseId}`)).toContain('released data never changes');
    expect(await refusal(`UPDATE revisions SET analysis = '{}' WHERE id = ${s.rev1}`)).toContain('released data never changes');
    const again = await api().get(`/api/releases/${s.releaseId}/bundle`).set('Authorization', bearer(t.tester)).buffer(true).parse(binary);
    expect(sha256(again.body)).toBe(s.sha);
  });

  it('serves the report the bundle holds, byte for byte, to every role', async () => {
    const zip = await api().get(`/api/releases/${s.releaseId}/bundle`).set('Authorization', bearer(t.tester)).buffer(true).parse(binary);
    const inZip = (await readZip(zip.body)).find((e) => e.name.endsWith('/REPORT.md'));
    expect(inZip).toBeDefined();
    const res = await api().get(`/api/releases/${s.releaseId}/report`).set('Authorization', bearer(t.tester));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/markdown');
    expect(res.text).toBe(inZip!.content.toString('utf8'));
    expect(res.text).toContain('Walk unit');
    expect((await api().get('/api/releases/999999/report').set('Authorization', bearer(t.tester))).status).toBe(404);
  });

  it('a read-only token lists and pulls the release, and is refused on writes', async () => {
    const created = await api().post('/api/tokens').set('Authorization', bearer(t.tester)).send({ name: 'bench 2' });
    expect(created.status).toBe(201);
    expect(created.body.secret).toMatch(/^vsk_/);
    s.token = created.body.secret;
    s.tokenId = created.body.id;
    const listed = await api().get('/api/tokens').set('Authorization', bearer(t.tester));
    expect(JSON.stringify(listed.body)).not.toContain(s.token);
    expect((await api().get('/api/releases?design=Walk%20unit').set('Authorization', bearer(s.token))).body[0].sha256).toBe(s.sha);
    const write = await api().post(`/api/designs/${s.designId}/revisions`).set('Authorization', bearer(s.token)).send({ summary: 'x' });
    expect(write.status).toBe(403);
    expect((await api().post('/api/tokens').set('Authorization', bearer(s.token)).send({ name: 'x' })).status).toBe(403);

    const out = path.join(dir, 'pulled.zip');
    const pulled = await run(process.execPath, ['bin/varsmith.mjs', 'pull', '--server', baseUrl, '--token', s.token, '--design', 'Walk unit', '--set-version', '1.0.0', '-o', out], { cwd: path.resolve('.') });
    expect(pulled.stdout).toContain('verified');
    expect(sha256(readFileSync(out))).toBe(s.sha);
  });

  it('pull refuses a tampered download (exit 1, nothing written)', async () => {
    // A proxy that passes everything through but flips one byte of the bundle.
    const proxy = createServer(async (req, res) => {
      const upstream = await fetch(`${baseUrl}${req.url}`, { headers: { authorization: String(req.headers.authorization) } });
      const body = Buffer.from(await upstream.arrayBuffer());
      if (req.url?.endsWith('/bundle')) body[body.length >> 1] ^= 0xff;
      res.writeHead(upstream.status, { 'content-type': upstream.headers.get('content-type') ?? 'application/octet-stream' });
      res.end(body);
    });
    await new Promise<void>((r) => proxy.listen(0, '127.0.0.1', () => r()));
    const out = path.join(dir, 'tampered.zip');
    try {
      const err = await run(process.execPath, ['bin/varsmith.mjs', 'pull', '--server', `http://127.0.0.1:${(proxy.address() as AddressInfo).port}`, '--token', s.token, '--design', 'Walk unit', '--set-version', '1.0.0', '-o', out]).then(() => null, (e: { code: number; stderr: string }) => e);
      expect(err?.code).toBe(1);
      expect(err?.stderr).toContain('does not match');
      expect(existsSync(out)).toBe(false);
    } finally {
      await new Promise((r) => proxy.close(r));
    }
  });

  it('a revoked token is refused', async () => {
    expect((await api().delete(`/api/tokens/${s.tokenId}`).set('Authorization', bearer(t.tester))).body.revokedAt).not.toBeNull();
    expect((await api().get('/api/releases').set('Authorization', bearer(s.token))).status).toBe(401);
  });

  it('revision 2 supersedes nothing released; diff shows the changed inputs and header', async () => {
    const design = buildDesign({ name: 'Walk unit', currentLoop: { crossoverHz: 900, harmonics: [1, 3, 5, 7], resonantBandwidthHz: 0.5, kp: null, resonantGains: null } });
    expect((await api().put(`/api/designs/${s.designId}`).set('Authorization', bearer(t.engineer)).send({ design, baseVersion: s.version })).status).toBe(200);
    const r2 = await api().post(`/api/designs/${s.designId}/revisions`).set('Authorization', bearer(t.engineer)).send({ summary: 'Crossover 900 Hz' });
    expect(r2.body.number).toBe(2);
    s.rev2 = r2.body.id;
    const diff = await api().get(`/api/revisions/${s.rev1}/diff/${s.rev2}`).set('Authorization', bearer(t.reviewer));
    expect(diff.status).toBe(200);
    const inputPaths = diff.body.inputs.map((c: { path: string }) => c.path);
    expect(inputPaths).toEqual(['currentLoop.crossoverHz', 'reactiveFilter.cutoffHz']);
    expect(diff.body.inputs[0]).toEqual({ path: 'currentLoop.crossoverHz', before: 1000, after: 900 });
    expect(diff.body.gains.map((c: { path: string }) => c.path)).toContain('current-pr.kp');
    expect(diff.body.coefficients.length).toBeGreaterThan(0);
    expect(diff.body.fixedCoefficients.length).toBeGreaterThan(0);
    expect(diff.body.headerDiff).toMatch(/^-/m);
    expect(diff.body.headerDiff).toMatch(/^\+/m);
    const same = await api().get(`/api/revisions/${s.rev2}/diff/${s.rev2}`).set('Authorization', bearer(t.reviewer));
    expect(same.body.inputs).toEqual([]);
    expect(same.body.headerDiff).toBe('');
    expect((await api().get(`/api/designs/${s.designId}/revisions`).set('Authorization', bearer(t.reviewer))).body.map((r: { number: number; status: string }) => [r.number, r.status])).toEqual([[2, 'in-review'], [1, 'released']]);
  });

  it('a third submission supersedes the open revision 2', async () => {
    const r3 = await api().post(`/api/designs/${s.designId}/revisions`).set('Authorization', bearer(t.engineer)).send({ summary: 'Same again' });
    expect(r3.body.number).toBe(3);
    expect((await api().get(`/api/revisions/${s.rev2}`).set('Authorization', bearer(t.reviewer))).body.status).toBe('superseded');
    // Approved, but 1.0.0 is taken for this design: refused, and nothing is written.
    expect((await api().post(`/api/revisions/${r3.body.id}/reviews`).set('Authorization', bearer(t.reviewer)).send({ decision: 'approve' })).status).toBe(201);
    const dup = await api().post(`/api/revisions/${r3.body.id}/release`).set('Authorization', bearer(t.engineer)).send({ version: '1.0.0' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe('version-taken');
    expect((await api().get(`/api/revisions/${r3.body.id}`).set('Authorization', bearer(t.reviewer))).body.status).toBe('approved');
    expect((await api().get('/api/releases?design=Walk%20unit').set('Authorization', bearer(t.tester))).body).toHaveLength(1);
  });

  it('the local SMTP server captured the notifications', async () => {
    const mail = await api().get('/api/admin/mail?limit=500').set('Authorization', bearer(t.admin));
    expect(mail.status).toBe(200);
    const subjects = (to: string) => mail.body.filter((m: { to: string[] }) => m.to.includes(to)).map((m: { subject: string }) => m.subject);
    expect(subjects('reviewer@varsmith.test')).toContain('[Varsmith] Walk unit r1 waits for review');
    expect(subjects('engineer@varsmith.test')).toContain('[Varsmith] Walk unit r1 approved');
    expect(subjects('tester@varsmith.test')).toContain('[Varsmith] Walk unit 1.0.0 released (from r1)');
    const released = mail.body.find((m: { subject: string }) => m.subject === '[Varsmith] Walk unit 1.0.0 released (from r1)');
    expect(released.text).toContain(s.sha);
    // Every link lands on a page of the client: /revisions/<id> and /releases/<id>.
    expect(released.text).toContain(`/releases/${s.releaseId}\n`);
    const submitted = mail.body.find((m: { subject: string }) => m.subject === '[Varsmith] Walk unit r1 waits for review');
    expect(submitted.text).toContain(`/revisions/${s.rev1}\n`);
    expect(released.from).toContain('varsmith');
  });

  it('the audit log holds every step', async () => {
    const audit = await api().get('/api/admin/audit?limit=1000').set('Authorization', bearer(t.admin));
    const actions = new Set(audit.body.map((e: { action: string }) => e.action));
    for (const a of ['design.create', 'design.save', 'revision.submit', 'review.approve', 'release.create', 'release.download', 'token.create', 'token.use', 'token.revoke', 'revision.supersede', 'user.role-change']) {
      expect(actions).toContain(a);
    }
    const downloads = audit.body.filter((e: { action: string; targetId: number }) => e.action === 'release.download' && e.targetId === s.releaseId);
    expect(downloads.length).toBeGreaterThanOrEqual(3);
    expect(downloads.some((e: { actor: { kind: string } }) => e.actor.kind === 'token')).toBe(true);
    // Targets by name, not database id.
    const labelOf = (action: string) => audit.body.find((e: { action: string }) => e.action === action)?.targetLabel;
    expect(labelOf('release.create')).toBe('Walk unit 1.0.0');
    expect(audit.body.filter((e: { action: string }) => e.action === 'revision.submit').map((e: { targetLabel: string }) => e.targetLabel)).toContain('Walk unit r1');
    expect(audit.body.filter((e: { action: string }) => e.action === 'design.create').map((e: { targetLabel: string }) => e.targetLabel)).toContain('Walk unit');
    expect(labelOf('user.role-change')).toMatch(/@/);
    const filtered = await api().get('/api/admin/audit?action=release.create').set('Authorization', bearer(t.admin));
    expect(filtered.body.every((e: { action: string }) => e.action === 'release.create')).toBe(true);
  });
});
