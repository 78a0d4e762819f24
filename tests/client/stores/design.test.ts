// The workspace store against an HTTP-mocked API: save sends the base version, 409 becomes a
// conflict listing both sides' changes, submit and draft export save first when needed.
import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { http, HttpResponse } from 'msw';
import { server } from '../setup';
import { useDesignStore } from '../../../src/stores/design';
import { buildDesignDetail } from '../fixtures';

describe('useDesignStore', () => {
  beforeEach(() => setActivePinia(createPinia()));

  it('loads a working copy and is clean until the draft changes', async () => {
    server.use(http.get('*/api/designs/7', () => HttpResponse.json(buildDesignDetail())));
    const store = useDesignStore();
    await store.load(7);
    expect(store.saved?.version).toBe(3);
    expect(store.dirty).toBe(false);
    store.setDraft({ ...store.saved!.design, grid: { voltageRmsV: 230, frequencyHz: 50 } });
    expect(store.dirty).toBe(true);
    store.setDraft(null);
    expect(store.draftInvalid).toBe(true);
    expect(store.dirty).toBe(true);
  });

  it('saves with the base version and adopts the new one', async () => {
    let body: { design: { grid: { voltageRmsV: number } }; baseVersion: number } | null = null;
    server.use(
      http.get('*/api/designs/7', () => HttpResponse.json(buildDesignDetail())),
      http.put('*/api/designs/7', async ({ request }) => {
        body = (await request.json()) as typeof body;
        return HttpResponse.json(buildDesignDetail({ version: 4, design: body!.design as never }));
      }),
    );
    const store = useDesignStore();
    await store.load(7);
    store.setDraft({ ...store.saved!.design, grid: { voltageRmsV: 230, frequencyHz: 50 } });
    const saved = await store.save();
    expect(body!.baseVersion).toBe(3);
    expect(body!.design.grid.voltageRmsV).toBe(230);
    expect(saved?.version).toBe(4);
    expect(store.dirty).toBe(false);
  });

  it('turns 409 into a conflict with their changes and mine, then reloads theirs', async () => {
    const theirs = buildDesignDetail({ version: 5 });
    theirs.design = { ...theirs.design, dcLink: { capacitanceF: 0.0033, voltageRefV: 200 } };
    let gets = 0;
    server.use(
      http.get('*/api/designs/7', () => { gets += 1; return HttpResponse.json(gets === 1 ? buildDesignDetail() : theirs); }),
      http.put('*/api/designs/7', () => HttpResponse.json({ error: { code: 'stale-version', message: 'Someone saved in between' } }, { status: 409 })),
    );
    const store = useDesignStore();
    await store.load(7);
    store.setDraft({ ...store.saved!.design, grid: { voltageRmsV: 230, frequencyHz: 60 } });
    expect(await store.save()).toBeNull();
    expect(store.conflict?.theirs.version).toBe(5);
    expect(store.conflict?.theirChanges).toEqual([{ path: 'dcLink.capacitanceF', before: '2200 µF', after: '3300 µF' }]);
    expect(store.conflict?.myChanges).toEqual([
      { path: 'dcLink.capacitanceF', before: '3300 µF', after: '2200 µF' },
      { path: 'grid.voltageRmsV', before: '120 V', after: '230 V' },
    ]);
    store.takeTheirs();
    expect(store.conflict).toBeNull();
    expect(store.saved?.version).toBe(5);
    expect(store.draft?.dcLink.capacitanceF).toBe(0.0033);
  });

  it('overwrites with the server version as base when forced after a conflict', async () => {
    const bases: number[] = [];
    server.use(
      http.get('*/api/designs/7', () => HttpResponse.json(buildDesignDetail({ version: bases.length ? 5 : 3 }))),
      http.put('*/api/designs/7', async ({ request }) => {
        const { baseVersion } = (await request.json()) as { baseVersion: number };
        bases.push(baseVersion);
        return baseVersion === 5 ? HttpResponse.json(buildDesignDetail({ version: 6 })) : HttpResponse.json({ error: { code: 'stale-version', message: 'stale' } }, { status: 409 });
      }),
    );
    const store = useDesignStore();
    await store.load(7);
    store.setDraft({ ...store.saved!.design, name: 'Bay 4 rig, trimmed' });
    await store.save();
    expect(store.conflict).not.toBeNull();
    const saved = await store.save(true);
    expect(bases).toEqual([3, 5]);
    expect(saved?.version).toBe(6);
    expect(store.conflict).toBeNull();
  });

  it('saves before submitting a dirty draft, then sends the summary', async () => {
    const calls: string[] = [];
    server.use(
      http.get('*/api/designs/7', () => HttpResponse.json(buildDesignDetail())),
      http.put('*/api/designs/7', () => { calls.push('save'); return HttpResponse.json(buildDesignDetail({ version: 4 })); }),
      http.post('*/api/designs/7/revisions', async ({ request }) => {
        calls.push(`submit:${((await request.json()) as { summary: string }).summary}`);
        return HttpResponse.json({ id: 11, number: 2, status: 'in-review' }, { status: 201 });
      }),
    );
    const store = useDesignStore();
    await store.load(7);
    store.setDraft({ ...store.saved!.design, name: 'Bay 4 rig B' });
    const revision = await store.submit('Lower crossover for the new choke');
    expect(calls).toEqual(['save', 'submit:Lower crossover for the new choke']);
    expect(revision?.number).toBe(2);
    expect(store.saved?.latestRevision?.status).toBe('in-review');
  });

  it('downloads a draft bundle and reports progress', async () => {
    const zip = new Uint8Array(4096).fill(7);
    server.use(
      http.get('*/api/designs/7', () => HttpResponse.json(buildDesignDetail())),
      http.post('*/api/designs/7/draft-bundle', () => new HttpResponse(zip, { headers: { 'Content-Type': 'application/zip', 'Content-Length': String(zip.byteLength), 'Content-Disposition': 'attachment; filename="bay-4-rig-draft.zip"' } })),
    );
    const store = useDesignStore();
    await store.load(7);
    const seen: number[] = [];
    const file = await store.exportDraft((p) => seen.push(p.receivedBytes));
    expect(file?.fileName).toBe('bay-4-rig-draft.zip');
    expect(file?.blob.size).toBe(4096);
    expect(seen[seen.length - 1]).toBe(4096);
  });

  it('refuses to save a draft with errors', async () => {
    server.use(http.get('*/api/designs/7', () => HttpResponse.json(buildDesignDetail())));
    const store = useDesignStore();
    await store.load(7);
    store.setDraft(null);
    await expect(store.save()).rejects.toThrow('Fix the highlighted fields');
  });
});
