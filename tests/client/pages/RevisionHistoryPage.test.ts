// The revision ledger: rows newest first, compare with the previous revision, pick two to compare,
// release only approved revisions and only for engineers and admins.
import { describe, expect, it } from 'vitest';
import { http, HttpResponse } from 'msw';
import { buildDesignDetail, buildRevisionSummary } from '../fixtures';
import { mountApp, settle, waitFor } from '../mountApp';
import { signInAs } from '../session';
import { server } from '../setup';

const revisions = [
  buildRevisionSummary({ id: 31, designId: 7, number: 1, status: 'superseded', summary: 'First set' }),
  buildRevisionSummary({ id: 33, designId: 7, number: 3, status: 'approved', summary: 'Lower crossover', errorCount: 0 }),
  buildRevisionSummary({ id: 32, designId: 7, number: 2, status: 'changes-requested', summary: 'More damping', errorCount: 1 }),
];

function answer(): void {
  server.use(
    http.get('*/api/designs/7/revisions', () => HttpResponse.json(revisions)),
    http.get('*/api/designs', () => HttpResponse.json([buildDesignDetail({ id: 7, name: 'Bay 4 rig' })])),
    http.get('*/api/releases', () => HttpResponse.json([])),
  );
}

describe('RevisionHistoryPage', () => {
  it('lists revisions newest first with the design name and links each to its predecessor', async () => {
    signInAs('reviewer');
    answer();
    const { root } = await mountApp('/designs/7/revisions');
    await waitFor(() => (root.querySelector('[data-test="history-table"]')?.textContent ?? '').includes('Lower crossover'));
    expect(root.querySelector('[data-test="history-title"]')!.textContent).toContain('Bay 4 rig');
    const order = [...root.querySelectorAll('[data-test="history-table"] tbody tr')].map((tr) => /r(\d)/.exec(tr.textContent ?? '')?.[1]);
    expect(order).toEqual(['3', '2', '1']);
    expect(root.querySelector('[data-test="history-compare-previous-3"]')!.getAttribute('href')).toBe('/revisions/32/compare/33');
    expect(root.querySelector('[data-test="history-compare-previous-1"]')).toBeNull();
    // Reviewers do not release.
    expect(root.querySelector('[data-test="history-release-3"]')).toBeNull();
  });

  it('compares two picked revisions, older first, whatever order they were ticked in', async () => {
    signInAs('engineer');
    answer();
    const app = await mountApp('/designs/7/revisions');
    const { root, router } = app;
    await waitFor(() => root.querySelector('[data-test="history-pick-3"]') !== null);
    root.querySelector<HTMLElement>('[data-test="history-pick-3"]')!.click();
    root.querySelector<HTMLElement>('[data-test="history-pick-1"]')!.click();
    await settle();
    server.use(
      http.get('*/api/revisions/:id', () => HttpResponse.json({ error: { code: 'not-found', message: 'gone' } }, { status: 404 })),
      http.get('*/api/revisions/:a/diff/:b', () => HttpResponse.json({ error: { code: 'not-found', message: 'gone' } }, { status: 404 })),
    );
    root.querySelector<HTMLElement>('[data-test="history-compare"]')!.click();
    await waitFor(() => router.currentRoute.value.name === 'revision-compare');
    expect(router.currentRoute.value.params).toEqual({ a: '31', b: '33' });
  });

  it('offers Release only on the approved revision for an engineer', async () => {
    signInAs('engineer');
    answer();
    const { root } = await mountApp('/designs/7/revisions');
    await waitFor(() => root.querySelector('[data-test="history-release-3"]') !== null);
    expect(root.querySelector('[data-test="history-release-2"]')).toBeNull();
    expect(root.querySelector('[data-test="history-release-1"]')).toBeNull();
  });

  it('pages the ledger through the server, and the last row of a page still compares with the one before it', async () => {
    signInAs('reviewer');
    const asked: string[] = [];
    let designQuery: URLSearchParams | null = null;
    server.use(
      http.get('*/api/designs/7/revisions', ({ request }) => {
        const query = new URL(request.url).searchParams;
        asked.push(`${query.get('limit')}@${query.get('offset')}`);
        const offset = Number(query.get('offset'));
        const numbers = Array.from({ length: Number(query.get('limit')) }, (_, i) => 30 - offset - i).filter((n) => n >= 1);
        return HttpResponse.json(numbers.map((n) => buildRevisionSummary({ id: 100 + n, designId: 7, number: n, summary: `set ${n}` })), { headers: { 'X-Total-Count': '30' } });
      }),
      http.get('*/api/designs', ({ request }) => {
        designQuery = new URL(request.url).searchParams;
        return HttpResponse.json([buildDesignDetail({ id: 7, name: 'Bay 4 rig' })]);
      }),
      http.get('*/api/releases', () => HttpResponse.json([])),
    );
    const { root } = await mountApp('/designs/7/revisions');
    const table = () => root.querySelector('[data-test="history-table"]')?.textContent ?? '';
    await waitFor(() => table().includes('set 30'));
    expect(designQuery!.get('id')).toBe('7');
    expect(table()).toContain('1–25 of 30');
    expect(table()).not.toContain('set 5');
    expect(root.querySelector('[data-test="history-compare-previous-6"]')!.getAttribute('href')).toBe('/revisions/105/compare/106');
    [...root.querySelectorAll<HTMLButtonElement>('[data-test="history-table"] .q-table__bottom button')].find((b) => b.textContent?.includes('chevron_right'))!.click();
    await waitFor(() => table().includes('set 5'));
    expect(table()).toContain('26–30 of 30');
    expect(asked).toEqual(['26@0', '26@25']);
    expect(root.querySelector('[data-test="history-compare-previous-1"]')).toBeNull();
  });
});
