// Whole-system runs over HTTP: POST /api/simulate for engineers and reviewers, the stored run of a
// revision, errors naming the option, and the time budget of the worker pool.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Booted } from '../../server/boot';
import { createSimulationPool } from '../../server/simulation/pool';
import type { Role } from '../../shared/api/common';
import { defaultSimulationOptions } from '../../shared/simulation';
import { buildDesign } from './factories';
import { allTokens, bearer, startApp } from './helpers';

let booted: Booted;
let t: Record<Role, string>;
const api = () => request(booted.app);
const short = { scenario: 'steady', durationS: 10 / 60, tracePoints: 50 };

beforeAll(async () => {
  booted = await startApp();
  t = await allTokens(booted.app);
});
afterAll(async () => { await booted.close(); });

describe('POST /api/simulate', () => {
  it('runs a scenario in the worker pool for an engineer and a reviewer, refuses a tester', { timeout: 60000 }, async () => {
    for (const role of ['engineer', 'reviewer'] as const) {
      const res = await api().post('/api/simulate').set('Authorization', bearer(t[role])).send({ design: buildDesign(), ...short });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({ format: 'varsmith-simulation/1', scenario: 'steady', model: 'averaged' });
      expect(res.body.metrics.gridPowerFactor).toBeGreaterThan(0.98);
      expect(res.body.traces.timeS.length).toBeLessThanOrEqual(50);
    }
    expect((await api().post('/api/simulate').set('Authorization', bearer(t.tester)).send({ design: buildDesign(), ...short })).status).toBe(403);
  });

  it('answers 400 naming the field: a bad design key, a bad option, a rule that needs the design', { timeout: 60000 }, async () => {
    const badDesign = await api().post('/api/simulate').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ dcLink: { capacitanceF: -1, voltageRefV: 200 } }), ...short });
    expect(badDesign.status).toBe(400);
    expect(badDesign.body.error.fields.map((f: { path: string }) => f.path)).toContain('design.dcLink.capacitanceF');
    const badOption = await api().post('/api/simulate').set('Authorization', bearer(t.engineer)).send({ design: buildDesign(), ...short, model: 'detailed' });
    expect(badOption.status).toBe(400);
    expect(badOption.body.error.fields.map((f: { path: string }) => f.path)).toContain('model');
    const tooShort = await api().post('/api/simulate').set('Authorization', bearer(t.engineer)).send({ design: buildDesign(), ...short, durationS: 0.01 });
    expect(tooShort.status).toBe(400);
    expect(tooShort.body.error).toMatchObject({ code: 'invalid-option', fields: [{ path: 'durationS' }] });
  });
});

describe('GET /api/revisions/:id/simulation', () => {
  it('computes a revision\'s run once, stores it and serves it as stored; 404 for no revision', { timeout: 60000 }, async () => {
    const created = await api().post('/api/designs').set('Authorization', bearer(t.engineer)).send({ design: buildDesign({ name: 'Simulated unit' }) });
    expect(created.status).toBe(201);
    const revision = await api().post(`/api/designs/${created.body.id}/revisions`).set('Authorization', bearer(t.engineer)).send({ summary: 'first' });
    expect(revision.status).toBe(201);
    const url = `/api/revisions/${revision.body.id}/simulation`;
    const first = await api().get(url).set('Authorization', bearer(t.reviewer));
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body).toMatchObject({ revisionId: revision.body.id, scenario: 'steady', model: 'averaged', harmonicTable: 'ieee-519', coefficients: 'quantized' });
    expect(first.body.result.format).toBe('varsmith-simulation/1');
    expect(first.body.result.controller.coefficients).toBe('quantized');
    const again = await api().get(url).set('Authorization', bearer(t.engineer));
    expect(again.body.computedAt).toBe(first.body.computedAt);
    expect(again.body.result).toEqual(first.body.result);
    const other = await api().get(`${url}?scenario=voltage-sag&harmonicTable=iec-61000-3-2-class-a`).set('Authorization', bearer(t.reviewer));
    expect(other.status).toBe(200);
    expect(other.body.result.scenario).toBe('voltage-sag');
    expect(other.body.result.harmonicLimits.table).toBe('iec-61000-3-2-class-a');
    expect((await api().get(`${url}?scenario=blackout`).set('Authorization', bearer(t.reviewer))).status).toBe(400);
    expect((await api().get('/api/revisions/99999/simulation').set('Authorization', bearer(t.reviewer))).status).toBe(404);
    expect((await api().get(url).set('Authorization', bearer(t.tester))).status).toBe(403);
  });
});

describe('simulation pool', () => {
  it('stops a run over its budget with 422 over-budget, and keeps working after', { timeout: 60000 }, async () => {
    const pool = createSimulationPool({ threads: 1, budgetMs: 50 });
    try {
      const design = buildDesign();
      await expect(pool.simulate(design, null, { ...defaultSimulationOptions('steady'), model: 'switched', durationS: 5 })).rejects.toMatchObject({ code: 'over-budget', status: 422 });
      const roomy = createSimulationPool({ threads: 1, budgetMs: 30000 });
      try {
        const ok = await roomy.simulate(design, null, { ...defaultSimulationOptions('steady'), durationS: 10 / 60, tracePoints: 20 });
        expect(ok.format).toBe('varsmith-simulation/1');
      } finally {
        await roomy.close();
      }
    } finally {
      await pool.close();
    }
  });
});
