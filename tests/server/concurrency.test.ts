// 20 concurrent submissions on one design give 20 distinct consecutive revision numbers.
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Booted } from '../../server/boot';
import { buildDesign } from './factories';
import { bearer, startApp, tokenFor } from './helpers';

let booted: Booted;
let engineer: string;
beforeAll(async () => {
  booted = await startApp();
  engineer = await tokenFor(booted.app, 'engineer');
});
afterAll(async () => { await booted.close(); });

it('numbers 20 concurrent submissions 1..20 without gaps or repeats; only the newest stays in review', async () => {
  const design = await request(booted.app).post('/api/designs').set('Authorization', bearer(engineer)).send({ design: buildDesign({ name: 'Burst unit' }) });
  expect(design.status).toBe(201);
  const results = await Promise.all(Array.from({ length: 20 }, (_, i) =>
    request(booted.app).post(`/api/designs/${design.body.id}/revisions`).set('Authorization', bearer(engineer)).send({ summary: `burst ${i}` })));
  expect(results.map((r) => r.status)).toEqual(Array(20).fill(201));
  const numbers = results.map((r) => r.body.number as number).sort((a, b) => a - b);
  expect(numbers).toEqual(Array.from({ length: 20 }, (_, i) => i + 1));
  const listed = await request(booted.app).get(`/api/designs/${design.body.id}/revisions`).set('Authorization', bearer(engineer));
  expect(listed.body.map((r: { number: number }) => r.number)).toEqual(Array.from({ length: 20 }, (_, i) => 20 - i));
  expect(listed.body.filter((r: { status: string }) => r.status === 'in-review').map((r: { number: number }) => r.number)).toEqual([20]);
  expect(listed.body.filter((r: { status: string }) => r.status === 'superseded')).toHaveLength(19);
});
