// Analyze, draft bundles, headers, withdrawal, and the demo history seeded on first start.
import { createHash } from 'node:crypto';
import { readdirSync } from 'node:fs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Booted } from '../../server/boot';
import type { Role } from '../../shared/api/common';
import { buildDesign } from './factories';
import { allTokens, bearer, startApp } from './helpers';

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

let booted: Booted;
let t: Record<Role, string>;
const api = () => request(booted.app);
beforeAll(async () => {
  booted = await startApp();
  t = await allTokens(booted.app);
});
afterAll(async () => { await booted.close(); });

describe('POST /api/analyze', () => {
  it('rejects a bad design with 400 naming the design path, before any computation', async () => {
    const res = await api().post('/api/analyze').set('Authorization', bearer(t.tester))
      .send({ design: buildDesign({ sampling: { switchingFrequencyHz: -5, updatesPerCarrier: 1, computationDelaySamples: 1 } }) });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain('design.sampling.switchingFrequencyHz');
  });

  it('analyses without plot data by default and with it on ?plots=1; the JSON round-trips', async () => {
    const plain = await api().post('/api/analyze').set('Authorization', bearer(t.reviewer)).send({ design: buildDesign() });
    expect(plain.status).toBe(200);
    expect(plain.body.format).toBe('varsmith-analysis/1');
    expect(plain.body.sampleTimeS).toBeCloseTo(5e-5, 15);
    expect(plain.body.blocks.map((b: { id: string }) => b.id).sort()).toEqual(['current-pr', 'pll-pi', 'reactive-lpf', 'sogi-d', 'sogi-q', 'voltage-pi']);
    const plotted = await api().post('/api/analyze?plots=1').set('Authorization', bearer(t.reviewer)).send({ design: buildDesign() });
    expect(plotted.status).toBe(200);
    expect(plotted.body.responses).toBeDefined();
    expect(JSON.parse(plotted.text)).toEqual(plotted.body);
    expect(plotted.text).not.toMatch(/NaN|Infinity/);
    expect((await api().post('/api/analyze?plots=yes').set('Authorization', bearer(t.reviewer)).send({ design: buildDesign() })).status).toBe(400);
  });
});

describe('drafts, headers and withdrawal', () => {
  let designId: number;
  let revisionId: number;
  let releaseId: number;

  it('exports a draft bundle of the working copy, the same bytes twice', async () => {
    const d = await api().post('/api/designs').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ name: 'Draft unit' }) });
    designId = d.body.id;
    const a = await api().post(`/api/designs/${designId}/draft-bundle`).set('Authorization', bearer(t.engineer)).buffer(true).parse(binary);
    const b = await api().post(`/api/designs/${designId}/draft-bundle`).set('Authorization', bearer(t.engineer)).buffer(true).parse(binary);
    expect(a.status).toBe(200);
    expect(a.headers['content-type']).toBe('application/zip');
    expect(a.body.subarray(0, 2).toString('latin1')).toBe('PK');
    expect(sha256(a.body)).toBe(a.headers['x-content-sha256']);
    expect(Buffer.compare(a.body, b.body)).toBe(0);
  });

  it('serves the generated header of a revision', async () => {
    const r = await api().post(`/api/designs/${designId}/revisions`).set('Authorization', bearer(t.engineer)).send({ summary: 'for release' });
    revisionId = r.body.id;
    const h = await api().get(`/api/revisions/${revisionId}/header`).set('Authorization', bearer(t.reviewer));
    expect(h.status).toBe(200);
    expect(h.text).toMatch(/#define|#ifndef/);
  });

  it('withdraws a release: still listed and downloadable, marked with who and why; never twice', async () => {
    await api().post(`/api/revisions/${revisionId}/reviews`).set('Authorization', bearer(t.reviewer)).send({ decision: 'approve' });
    const rel = await api().post(`/api/revisions/${revisionId}/release`).set('Authorization', bearer(t.admin)).send({ version: '2.1.0-rc.1' });
    expect(rel.status).toBe(201);
    releaseId = rel.body.id;
    const w = await api().post(`/api/releases/${releaseId}/withdraw`).set('Authorization', bearer(t.engineer)).send({ reason: 'Bench showed a resonance at 1.2 kHz' });
    expect(w.status).toBe(200);
    expect(w.body).toMatchObject({ withdrawnReason: 'Bench showed a resonance at 1.2 kHz', withdrawnBy: { email: 'engineer@varsmith.test' } });
    expect(w.body.withdrawnAt).not.toBeNull();
    expect((await api().post(`/api/releases/${releaseId}/withdraw`).set('Authorization', bearer(t.engineer)).send({ reason: 'again' })).status).toBe(409);
    const bundle = await api().get(`/api/releases/${releaseId}/bundle`).set('Authorization', bearer(t.tester)).buffer(true).parse(binary);
    expect(sha256(bundle.body)).toBe(rel.body.sha256);
    expect((await api().post(`/api/revisions/${revisionId}/reviews`).set('Authorization', bearer(t.reviewer)).send({ decision: 'approve' })).status).toBe(409);
  });
});

describe('release gate', () => {
  it('refuses releasing an approved revision that has an error check (422 naming the checks)', async () => {
    const d = await api().post('/api/designs').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ name: 'Narrow word unit', fixedPoint: { wordBits: 16 } }) });
    const r = await api().post(`/api/designs/${d.body.id}/revisions`).set('Authorization', bearer(t.engineer)).send({ summary: '16-bit words' });
    const errors = r.body.analysis.checks.filter((c: { severity: string }) => c.severity === 'error').map((c: { id: string }) => c.id);
    expect(errors.length).toBeGreaterThan(0);
    expect(r.body.errorCount).toBe(errors.length);
    expect((await api().post(`/api/revisions/${r.body.id}/reviews`).set('Authorization', bearer(t.reviewer)).send({ decision: 'approve' })).status).toBe(201);
    const rel = await api().post(`/api/revisions/${r.body.id}/release`).set('Authorization', bearer(t.engineer)).send({ version: '1.0.0' });
    expect(rel.status).toBe(422);
    expect(rel.body.error.code).toBe('error-checks');
    expect(rel.body.error.details.checks).toEqual(errors);
    expect((await api().get(`/api/revisions/${r.body.id}`).set('Authorization', bearer(t.engineer))).body.status).toBe('approved');
  });
});

const examples = (() => { try { return readdirSync('examples').filter((f) => f.endsWith('.json')); } catch { return []; } })();

describe.skipIf(examples.length < 3)('demo history', () => {
  it('seeds one released set, one revision in review and one sent back with comments', async () => {
    const listed = await api().get('/api/designs').set('Authorization', bearer(t.engineer));
    // Only the seeded designs (the tests above add two).
    const designs = { body: listed.body.filter((d: { name: string }) => !['Draft unit', 'Narrow word unit'].includes(d.name)) };
    expect(designs.body).toHaveLength(examples.length);
    const statuses = designs.body.map((d: { latestRevision: { status: string } | null }) => d.latestRevision?.status).filter(Boolean).sort();
    expect(statuses).toEqual(expect.arrayContaining(['changes-requested', 'in-review', 'released']));
    const released = designs.body.find((d: { latestRelease: unknown }) => d.latestRelease !== null);
    expect(released.latestRelease.version).toBe('1.0.0');
    const sentBack = designs.body.find((d: { latestRevision: { status: string } | null }) => d.latestRevision?.status === 'changes-requested');
    const rev = await api().get(`/api/revisions/${sentBack.latestRevision.id}`).set('Authorization', bearer(t.engineer));
    expect(rev.body.reviews[0].comment.length).toBeGreaterThan(0);
    const mail = await api().get('/api/admin/mail').set('Authorization', bearer(t.admin));
    expect(mail.body.length).toBeGreaterThan(0);
  });
});
