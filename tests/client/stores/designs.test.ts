// The designs list store against an HTTP-mocked API.
import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { http, HttpResponse } from 'msw';
import { server } from '../setup';
import { useDesignsStore } from '../../../src/stores/designs';
import { buildDesignDetail } from '../fixtures';

describe('useDesignsStore', () => {
  beforeEach(() => setActivePinia(createPinia()));

  it('loads the rows (bare array or wrapped)', async () => {
    server.use(http.get('*/api/designs', () => HttpResponse.json({ designs: [buildDesignDetail()] })));
    const store = useDesignsStore();
    expect(store.loaded).toBe(false);
    await store.load();
    expect(store.loaded).toBe(true);
    expect(store.items.map((d) => d.name)).toEqual(['Bay 4 rig']);
  });

  it('creates a design from the template with every gain designed by rule', async () => {
    let sent: { design: { name: string; currentLoop: { kp: unknown }; format: string } } | null = null;
    server.use(http.post('*/api/designs', async ({ request }) => {
      sent = (await request.json()) as typeof sent;
      return HttpResponse.json(buildDesignDetail({ id: 9, name: sent!.design.name }), { status: 201 });
    }));
    const store = useDesignsStore();
    const created = await store.create('Pilot rack 2');
    expect(sent!.design.format).toBe('varsmith-design/1');
    expect(sent!.design.name).toBe('Pilot rack 2');
    expect(sent!.design.currentLoop.kp).toBeNull();
    expect(created.id).toBe(9);
    expect(store.items[0].id).toBe(9);
  });

  it('surfaces the API error with its fields', async () => {
    server.use(http.post('*/api/designs', () => HttpResponse.json({ error: { code: 'validation', message: 'Invalid design', fields: [{ path: 'design.name', message: 'Required' }] } }, { status: 400 })));
    const store = useDesignsStore();
    await expect(store.create('x')).rejects.toMatchObject({ status: 400, fields: [{ path: 'design.name', message: 'Required' }] });
  });
});
