// The list routes page: designs, revisions, releases, audit, mail. Each answers the JSON array of
// CONTRACT section 6 cut to one page (default size without parameters), with the number of matching
// rows in X-Total-Count; pages walk every row once; filters are case-insensitive on both databases;
// a page costs the same number of queries whatever its size, and never reads bundles, frozen
// designs, analyses or working copies.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Booted } from '../../server/boot';
import type { Role } from '../../shared/api/common';
import { PAGE_SIZES } from '../../shared/api/paging';
import { buildDesign, insertReleases, type InsertedReleases } from './factories';
import { allTokens, bearer, startApp } from './helpers';

let booted: Booted;
let t: Record<Role, string>;
let made: InsertedReleases;
const api = () => request(booted.app);
const total = (res: request.Response) => Number(res.headers['x-total-count']);

/**
 * Runs a request and returns its response with the SQL it sent.
 * @param send - the request.
 * @returns response and statements.
 */
async function withSql(send: () => request.Test): Promise<{ res: request.Response; sql: string[] }> {
  const sql: string[] = [];
  const options = (booted.ctx.db.sequelize as unknown as { options: { logging: false | ((s: string) => void) } }).options;
  options.logging = (s: string) => { sql.push(s); };
  try {
    return { res: await send(), sql };
  } finally {
    options.logging = false;
  }
}

beforeAll(async () => {
  booted = await startApp();
  t = await allTokens(booted.app);
  made = await insertReleases(booted.ctx, 'Paging Rack', PAGE_SIZES.releases.default + 5);
});
afterAll(async () => { await booted.close(); });

describe('GET /api/releases', () => {
  it('without parameters answers the first page of the default size, newest first, with the total', async () => {
    const res = await api().get('/api/releases').set('Authorization', bearer(t.tester));
    expect(res.status).toBe(200);
    expect(Array.isArray(res.body)).toBe(true);
    expect(res.body).toHaveLength(PAGE_SIZES.releases.default);
    const all = await api().get(`/api/releases?limit=${PAGE_SIZES.releases.max}`).set('Authorization', bearer(t.tester));
    expect(total(res)).toBe(all.body.length);
    expect(total(res)).toBeGreaterThanOrEqual(made.releaseIds.length);
    const ids = all.body.map((r: { id: number }) => r.id);
    expect(ids).toEqual([...ids].sort((a: number, b: number) => b - a));
    expect(res.body[0]).toMatchObject({ designName: 'Paging Rack', version: `0.${made.releaseIds.length}.0`, revisionNumber: made.releaseIds.length, releasedBy: { email: 'engineer@varsmith.test' } });
  });

  it('walks every release once page by page', async () => {
    const seen: number[] = [];
    for (let offset = 0; offset < made.releaseIds.length; offset += 7) {
      const page = await api().get(`/api/releases?designId=${made.designId}&limit=7&offset=${offset}`).set('Authorization', bearer(t.tester));
      expect(total(page)).toBe(made.releaseIds.length);
      seen.push(...page.body.map((r: { id: number }) => r.id));
    }
    expect(seen).toEqual([...made.releaseIds].reverse());
    const past = await api().get(`/api/releases?designId=${made.designId}&offset=${made.releaseIds.length}`).set('Authorization', bearer(t.tester));
    expect(past.body).toEqual([]);
    expect(total(past)).toBe(made.releaseIds.length);
  });

  it('filters by exact design and version (what `varsmith pull` asks) and by part of the name or version, any case', async () => {
    const exact = await api().get('/api/releases?design=Paging%20Rack&version=0.3.0').set('Authorization', bearer(t.tester));
    expect(exact.body.map((r: { version: string }) => r.version)).toEqual(['0.3.0']);
    expect(total(exact)).toBe(1);
    const byName = await api().get('/api/releases?q=pAGING&limit=1').set('Authorization', bearer(t.tester));
    expect(total(byName)).toBe(made.releaseIds.length);
    const byVersion = await api().get(`/api/releases?q=0.${made.releaseIds.length}.`).set('Authorization', bearer(t.tester));
    expect(byVersion.body.map((r: { version: string }) => r.version)).toEqual([`0.${made.releaseIds.length}.0`]);
    const none = await api().get('/api/releases?design=No%20such%20design').set('Authorization', bearer(t.tester));
    expect(none.body).toEqual([]);
    expect(total(none)).toBe(0);
  });

  it('refuses a control character in a text filter with 400 on every list (PostgreSQL would fail on a NUL byte)', async () => {
    for (const [route, field, token] of [
      ['/api/releases?q=a%00b', 'query.q', 'tester'], ['/api/releases?design=a%00b', 'query.design', 'tester'], ['/api/designs?q=a%01b', 'query.q', 'admin'],
      ['/api/admin/mail?to=a%00b', 'query.to', 'admin'], ['/api/admin/audit?targetType=a%00b', 'query.targetType', 'admin'],
    ] as const) {
      const res = await api().get(route).set('Authorization', bearer(t[token]));
      expect(res.status, route).toBe(400);
      expect(res.body.error.fields[0]).toEqual({ path: field, message: 'must not contain control characters' });
    }
    const far = await api().get('/api/releases?designId=3000000000').set('Authorization', bearer(t.tester));
    expect(far.status).toBe(200);
    expect(far.body).toEqual([]);
  });

  it('refuses page parameters out of bounds with 400 naming the field and the rule', async () => {
    for (const [query, path, rule] of [
      ['limit=0', 'query.limit', 'at least 1'], [`limit=${PAGE_SIZES.releases.max + 1}`, 'query.limit', `at most ${PAGE_SIZES.releases.max}`],
      ['offset=-1', 'query.offset', 'negative'], ['offset=1e9', 'query.offset', 'at most'], ['limit=ten', 'query.limit', ''],
    ] as const) {
      const res = await api().get(`/api/releases?${query}`).set('Authorization', bearer(t.tester));
      expect(res.status, query).toBe(400);
      expect(res.body.error.fields[0].path).toBe(path);
      expect(res.body.error.fields[0].message).toContain(rule);
    }
  });

  it('costs the same queries for 5 or 50 rows and never reads the bundle bytes', async () => {
    const small = await withSql(() => api().get('/api/releases?limit=5').set('Authorization', bearer(t.tester)));
    const large = await withSql(() => api().get('/api/releases?limit=50').set('Authorization', bearer(t.tester)));
    expect(large.res.body).toHaveLength(50);
    expect(small.sql.some((s) => /FROM\W+releases\W/.test(s))).toBe(true);
    expect(large.sql.length).toBe(small.sql.length);
    expect(large.sql.join('\n')).not.toMatch(/bundle/);
  });
});

describe('GET /api/designs and GET /api/designs/:id/revisions', () => {
  it('pages designs by name with the total; filters by part of the name in any case and by the latest status', async () => {
    await api().post('/api/designs').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ name: 'Quay Cabinet West' }) });
    const second = await api().post('/api/designs').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ name: 'quay cabinet east' }) });
    await api().post(`/api/designs/${second.body.id}/revisions`).set('Authorization', bearer(t.engineer)).send({ summary: 'first set' });
    const all = await api().get('/api/designs?limit=200').set('Authorization', bearer(t.reviewer));
    const firstTwo = await api().get('/api/designs?limit=2').set('Authorization', bearer(t.reviewer));
    expect(firstTwo.body.map((d: { id: number }) => d.id)).toEqual(all.body.slice(0, 2).map((d: { id: number }) => d.id));
    expect(total(firstTwo)).toBe(all.body.length);
    const quay = await api().get('/api/designs?q=QUAY%20cab').set('Authorization', bearer(t.reviewer));
    expect(quay.body.map((d: { name: string }) => d.name).sort()).toEqual(['Quay Cabinet West', 'quay cabinet east']);
    const inReview = await api().get('/api/designs?status=in-review&limit=200').set('Authorization', bearer(t.reviewer));
    expect(inReview.body.length).toBeGreaterThan(0);
    expect(inReview.body.every((d: { latestRevision: { status: string } | null }) => d.latestRevision?.status === 'in-review')).toBe(true);
    expect(inReview.body.map((d: { name: string }) => d.name)).toContain('quay cabinet east');
    expect(total(inReview)).toBe(all.body.filter((d: { latestRevision: { status: string } | null }) => d.latestRevision?.status === 'in-review').length);
    const one = await api().get(`/api/designs?id=${second.body.id}`).set('Authorization', bearer(t.reviewer));
    expect(one.body.map((d: { name: string }) => d.name)).toEqual(['quay cabinet east']);
    expect(total(one)).toBe(1);
    const newest = await api().get('/api/designs?sort=-updatedAt&limit=1').set('Authorization', bearer(t.reviewer));
    expect(newest.body[0].name).toBe('quay cabinet east');
    expect((await api().get('/api/designs?sort=owner').set('Authorization', bearer(t.reviewer))).status).toBe(400);
  });

  it('a designs page costs the same queries for 1 or all rows and reads no working copy', async () => {
    const one = await withSql(() => api().get('/api/designs?limit=1').set('Authorization', bearer(t.admin)));
    const all = await withSql(() => api().get('/api/designs?limit=200').set('Authorization', bearer(t.admin)));
    expect(all.res.body.length).toBeGreaterThan(3);
    expect(one.sql.some((s) => /FROM\W+designs\W/.test(s))).toBe(true);
    expect(all.sql.length).toBe(one.sql.length);
    expect(all.sql.join('\n')).not.toMatch(/content|analysis|bundle/);
    const paging = all.res.body.find((d: { name: string }) => d.name === 'Paging Rack');
    expect(paging).toMatchObject({ latestRevision: { number: made.revisionIds.length, status: 'released' }, latestRelease: { version: `0.${made.releaseIds.length}.0`, revisionNumber: made.revisionIds.length } });
  });

  it('pages revisions newest first with the total, reading no frozen design or analysis', async () => {
    const { res, sql } = await withSql(() => api().get(`/api/designs/${made.designId}/revisions?limit=10&offset=10`).set('Authorization', bearer(t.reviewer)));
    expect(total(res)).toBe(made.revisionIds.length);
    expect(res.body.map((r: { number: number }) => r.number)).toEqual(Array.from({ length: 10 }, (_, i) => made.revisionIds.length - 10 - i));
    expect(sql.some((s) => /FROM\W+revisions\W/.test(s))).toBe(true);
    expect(sql.join('\n')).not.toMatch(/analysis|"design"|`design`/);
    const first = await api().get(`/api/designs/${made.designId}/revisions`).set('Authorization', bearer(t.reviewer));
    expect(first.body).toHaveLength(PAGE_SIZES.revisions.default);
    const before = await api().get(`/api/designs/${made.designId}/revisions?before=7&limit=1`).set('Authorization', bearer(t.reviewer));
    expect(before.body.map((r: { number: number }) => r.number)).toEqual([6]);
    expect(total(before)).toBe(6);
  });
});

describe('GET /api/admin/audit and GET /api/admin/mail', () => {
  it('names the targets of an audit page with at most one query per kind of target, whatever the number of entries', async () => {
    const one = await withSql(() => api().get('/api/admin/audit?limit=1').set('Authorization', bearer(t.admin)));
    const all = await withSql(() => api().get('/api/admin/audit?limit=1000').set('Authorization', bearer(t.admin)));
    type Entry = { action: string; targetType: string; targetLabel: string | null; details: { number?: number } };
    const entries = all.res.body as Entry[];
    expect(new Set(entries.map((e) => e.targetType))).toEqual(new Set(['user', 'design', 'revision', 'release']));
    expect(entries.length).toBeGreaterThan(12);
    // Lookups: releases, design names, people, tokens; the one-entry page needs at least none of them.
    expect(all.sql.length - one.sql.length).toBeLessThanOrEqual(4);
    expect(entries.find((e) => e.action === 'design.create' && e.targetLabel === 'Quay Cabinet West')).toBeDefined();
    expect(entries.find((e) => e.targetType === 'user')!.targetLabel).toMatch(/@varsmith\.test$/);
    const submitted = entries.find((e) => e.action === 'revision.submit' && e.targetLabel?.startsWith('quay cabinet east'));
    expect(submitted?.targetLabel).toBe(`quay cabinet east r${submitted?.details.number}`);
    expect(entries.find((e) => e.action === 'release.create')!.targetLabel).toMatch(/ \d+\.\d+\.\d+/);
  });

  it('pages the audit log with the total', async () => {
    const first = await api().get('/api/admin/audit?limit=3').set('Authorization', bearer(t.admin));
    const next = await api().get('/api/admin/audit?limit=3&offset=3').set('Authorization', bearer(t.admin));
    const both = await api().get('/api/admin/audit?limit=6').set('Authorization', bearer(t.admin));
    expect([...first.body, ...next.body].map((e: { id: number }) => e.id)).toEqual(both.body.map((e: { id: number }) => e.id));
    expect(total(first)).toBeGreaterThan(6);
    expect(total(first)).toBe(total(both));
  });

  it('pages the mail outbox with the total; the recipient filter ignores case', async () => {
    const all = await api().get('/api/admin/mail?limit=500').set('Authorization', bearer(t.admin));
    expect(all.body.length).toBeGreaterThan(1);
    const second = await api().get('/api/admin/mail?limit=1&offset=1').set('Authorization', bearer(t.admin));
    expect(second.body.map((m: { id: number }) => m.id)).toEqual([all.body[1].id]);
    expect(total(second)).toBe(all.body.length);
    const reviewer = await api().get('/api/admin/mail?to=REVIEWER@VARSMITH').set('Authorization', bearer(t.admin));
    expect(total(reviewer)).toBe(all.body.filter((m: { to: string[] }) => m.to.includes('reviewer@varsmith.test')).length);
    expect(total(reviewer)).toBeGreaterThan(0);
  });
});
