// The designs list: rows with status, revision, release and owner; search; engineers create.
import { describe, expect, it } from 'vitest';
import { http, HttpResponse } from 'msw';
import { server } from '../setup';
import { mountApp, settle, waitFor } from '../mountApp';
import { signInAs } from '../session';
import { buildDesignDetail, buildReleaseSummary, buildRevisionSummary } from '../fixtures';

const rows = [
  buildDesignDetail({ id: 1, name: 'Bay 4 rig', latestRevision: buildRevisionSummary({ id: 10, designId: 1, number: 2, status: 'in-review' }), updatedAt: '2026-11-30T10:00:00Z' }),
  buildDesignDetail({ id: 2, name: 'Harbour cabinet LCL', owner: { id: 5, name: 'Kit Firmware', email: 'kit@varsmith.test' }, latestRevision: buildRevisionSummary({ id: 12, designId: 2, number: 4, status: 'approved' }), latestRelease: buildReleaseSummary({ version: '1.2.0', revisionNumber: 4 }), updatedAt: '2026-11-29T10:00:00Z' }),
];

function tableText(root: HTMLElement): string {
  return root.querySelector('[data-test="designs-table"]')?.textContent ?? '';
}

describe('DesignsPage', { timeout: 30000 }, () => {
  it('lists designs with status, latest revision and release, owner', async () => {
    signInAs('engineer');
    server.use(http.get('*/api/designs', () => HttpResponse.json(rows)));
    const { root } = await mountApp('/designs');
    await waitFor(() => tableText(root).includes('Harbour cabinet LCL'));
    const text = tableText(root);
    expect(text).toContain('in review');
    expect(text).toContain('r2');
    expect(text).toContain('approved');
    expect(text).toContain('1.2.0');
    expect(text).toContain('r4');
    expect(text).toContain('Kit Firmware');
    expect(root.querySelector('[data-test="new-design"]')).not.toBeNull();
  });

  it('asks the server for the designs whose name holds the search text, from the first page', async () => {
    signInAs('engineer');
    const asked: URLSearchParams[] = [];
    server.use(http.get('*/api/designs', ({ request }) => {
      const query = new URL(request.url).searchParams;
      asked.push(query);
      const q = (query.get('q') ?? '').toLowerCase();
      return HttpResponse.json(rows.filter((r) => r.name.toLowerCase().includes(q)));
    }));
    const { root } = await mountApp('/designs');
    await waitFor(() => tableText(root).includes('Harbour'));
    expect(Object.fromEntries(asked[0].entries())).toEqual({ sort: '-updatedAt', limit: '25', offset: '0' });
    const input = root.querySelector<HTMLInputElement>('[data-test="design-search"] input, input[data-test="design-search"]')!;
    input.value = 'harb';
    input.dispatchEvent(new Event('input'));
    await waitFor(() => !tableText(root).includes('Bay 4 rig'));
    expect(tableText(root)).toContain('Harbour cabinet LCL');
    expect(asked.at(-1)!.get('q')).toBe('harb');
    expect(asked.at(-1)!.get('offset')).toBe('0');
  });

  it('shows the total from X-Total-Count and fetches the next page from the server', async () => {
    signInAs('reviewer');
    const offsets: string[] = [];
    server.use(http.get('*/api/designs', ({ request }) => {
      const offset = Number(new URL(request.url).searchParams.get('offset'));
      offsets.push(String(offset));
      const page = Array.from({ length: offset === 0 ? 25 : 5 }, (_, i) => buildDesignDetail({ id: offset + i + 1, name: `Rack ${offset + i + 1}` }));
      return HttpResponse.json(page, { headers: { 'X-Total-Count': '30' } });
    }));
    const { root } = await mountApp('/designs');
    await waitFor(() => tableText(root).includes('Rack 25'));
    expect(tableText(root)).toContain('1–25 of 30');
    const next = [...root.querySelectorAll<HTMLButtonElement>('[data-test="designs-table"] .q-table__bottom button')]
      .find((b) => b.textContent?.includes('chevron_right'))!;
    next.click();
    await waitFor(() => tableText(root).includes('Rack 30'));
    expect(tableText(root)).toContain('26–30 of 30');
    expect(tableText(root)).not.toContain('Rack 25');
    expect(offsets).toEqual(['0', '25']);
  });

  it('shows the empty state, and no create button for a reviewer', async () => {
    signInAs('reviewer');
    server.use(http.get('*/api/designs', () => HttpResponse.json([])));
    const { root } = await mountApp('/designs');
    await waitFor(() => tableText(root).includes('No designs yet.'));
    expect(root.querySelector('[data-test="new-design"]')).toBeNull();
  });

  it('shows the load error with a retry', async () => {
    signInAs('admin');
    let calls = 0;
    server.use(http.get('*/api/designs', () => { calls += 1; return calls === 1 ? HttpResponse.json({ error: { code: 'internal', message: 'database busy' } }, { status: 503 }) : HttpResponse.json(rows); }));
    const { root } = await mountApp('/designs');
    await waitFor(() => (root.textContent ?? '').includes('database busy'));
    const retry = [...root.querySelectorAll('button')].find((b) => b.textContent?.includes('Retry'))!;
    retry.click();
    await waitFor(() => tableText(root).includes('Harbour'));
  });

  it('creates a design and opens it in the workspace', async () => {
    signInAs('engineer');
    let created: { design: { name: string } } | null = null;
    server.use(
      http.get('*/api/designs', () => HttpResponse.json([])),
      http.post('*/api/designs', async ({ request }) => {
        created = (await request.json()) as typeof created;
        return HttpResponse.json(buildDesignDetail({ id: 42, name: created!.design.name }), { status: 201 });
      }),
      http.get('*/api/designs/42', () => HttpResponse.json(buildDesignDetail({ id: 42, name: 'Pilot rack 2' }))),
    );
    const { root, router } = await mountApp('/designs');
    await waitFor(() => root.querySelector('[data-test="new-design"]') !== null);
    (root.querySelector('[data-test="new-design"]') as HTMLElement).click();
    await waitFor(() => document.querySelector('[data-test="new-design-name"]') !== null);
    const input = document.querySelector<HTMLInputElement>('[data-test="new-design-name"] input, input[data-test="new-design-name"]')!;
    input.value = 'Pilot rack 2';
    input.dispatchEvent(new Event('input'));
    await settle();
    (document.querySelector('[data-test="create-design"]') as HTMLElement).closest('form')!.dispatchEvent(new Event('submit'));
    await waitFor(() => router.currentRoute.value.name === 'design-workspace');
    expect(created!.design.name).toBe('Pilot rack 2');
    expect(router.currentRoute.value.params.id).toBe('42');
  });

  it('creates a design as a copy of another, reading its saved values', async () => {
    signInAs('engineer');
    let created: { design: { name: string; filter: { topology: string } } } | null = null;
    const source = buildDesignDetail({ id: 5, name: 'Quay 2 LCL', design: { ...buildDesignDetail().design, name: 'Quay 2 LCL', filter: { topology: 'LCL', inverterInductanceH: 1e-3, gridInductanceH: 5e-4, capacitanceF: 8.2e-6, dampingResistanceOhm: 2, resistanceOhm: 0.05 } } });
    server.use(
      http.get('*/api/designs', () => HttpResponse.json([source])),
      http.get('*/api/designs/5', () => HttpResponse.json(source)),
      http.post('*/api/designs', async ({ request }) => {
        created = (await request.json()) as typeof created;
        return HttpResponse.json(buildDesignDetail({ id: 43, name: created!.design.name }), { status: 201 });
      }),
      http.get('*/api/designs/43', () => HttpResponse.json(buildDesignDetail({ id: 43 }))),
    );
    const { root, router } = await mountApp('/designs');
    await waitFor(() => root.querySelector('[data-test="new-design"]') !== null);
    (root.querySelector('[data-test="new-design"]') as HTMLElement).click();
    await waitFor(() => document.querySelector('[data-test="new-design-name"]') !== null);
    const name = document.querySelector<HTMLInputElement>('[data-test="new-design-name"] input, input[data-test="new-design-name"]')!;
    name.value = 'Quay 3 LCL';
    name.dispatchEvent(new Event('input'));
    // The rating start names its rules ...
    expect(document.querySelector('[data-test="new-design-sizing"]')!.textContent).toContain('5 % of grid voltage');
    // ... the copy start reads the chosen design when confirmed.
    [...document.querySelectorAll<HTMLElement>('[data-test="new-design-start"] .q-radio')].find((r) => r.textContent?.includes('Copy'))!.click();
    await settle();
    const dialog = document.querySelector('[data-test="new-design-dialog"]')!;
    dialog.querySelector('form')!.dispatchEvent(new Event('submit'));
    await settle();
    expect(created).toBeNull();
    expect(dialog.textContent).toContain('Pick the design to copy.');
    (dialog.querySelector('[data-test="new-design-source"]') as HTMLElement).click();
    await waitFor(() => [...document.querySelectorAll('.q-item')].some((i) => i.textContent?.includes('Quay 2 LCL')));
    [...document.querySelectorAll<HTMLElement>('.q-item')].find((i) => i.textContent?.includes('Quay 2 LCL'))!.click();
    await settle();
    dialog.querySelector('form')!.dispatchEvent(new Event('submit'));
    await waitFor(() => router.currentRoute.value.name === 'design-workspace');
    expect(created!.design.name).toBe('Quay 3 LCL');
    expect(created!.design.filter.topology).toBe('LCL');
  });

  it('refuses the designs list to a tester (sent to released sets)', async () => {
    signInAs('tester');
    server.use(http.get('*/api/releases', () => HttpResponse.json([])));
    const { router } = await mountApp('/designs');
    await waitFor(() => router.currentRoute.value.name === 'releases');
  });
});
