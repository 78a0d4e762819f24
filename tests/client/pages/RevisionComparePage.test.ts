// The comparison page: two revisions side by side, the change list, the highlighted header diff,
// and the verdict panel (disabled with the reason on one's own revision).
import { describe, expect, it } from 'vitest';
import { http, HttpResponse } from 'msw';
import { createTwoFilesPatch } from 'diff';
import type { RevisionDetail } from '../../../src/api/types';
import type { RevisionDiff } from '../../../shared/api/revisions';
import { newDesignTemplate } from '../../../src/stores/designs';
import { buildAnalysis } from '../analysisFixture';
import { buildRevisionSummary } from '../fixtures';
import { mountApp, settle, waitFor } from '../mountApp';
import { signInAs, TEST_USERS } from '../session';
import { server } from '../setup';

function buildDetail(overrides: Partial<RevisionDetail>): RevisionDetail {
  return {
    ...buildRevisionSummary(), designName: 'Bay 4 rig', design: newDesignTemplate('Bay 4 rig'), analysis: buildAnalysis(), reviews: [], release: null,
    ...overrides,
  };
}

const r1 = buildDetail({ id: 10, number: 1, status: 'superseded', summary: 'First set' });
const r2Design = { ...newDesignTemplate('Bay 4 rig'), filter: { topology: 'L' as const, inductanceH: 0.00075, resistanceOhm: 0.03 } };
const r2Analysis = buildAnalysis();
r2Analysis.blocks[0].gains.kp = 4.712388980384690;
r2Analysis.blocks[0].sections[1].fixed.a = [16384, -32760, 16381];
const r2 = buildDetail({ id: 11, number: 2, status: 'in-review', summary: 'Bigger inductor', design: r2Design, analysis: r2Analysis });

const headerDiff = createTwoFilesPatch('r1/coefficients.h', 'r2/coefficients.h', '#define VS_PR_KP 3.77\n#define VS_PR_H1_A1 -32761\n', '#define VS_PR_KP 4.71\n#define VS_PR_H1_A1 -32760\n');
const diff: RevisionDiff = {
  from: { id: 10, number: 1, designId: 7 }, to: { id: 11, number: 2, designId: 7 },
  inputs: [{ path: 'filter.inductanceH', before: 0.0006, after: 0.00075 }],
  gains: [{ path: 'current-pr.kp', before: 3.7699111843077517, after: 4.71238898038469 }],
  coefficients: [], fixedCoefficients: [{ path: 'current-pr/resonant-h1.a[1]', before: -32761, after: -32760 }], formats: [], margins: [],
  checks: { added: [], removed: [], changed: [] },
  headerDiff,
};

function answerComparison(): void {
  server.use(
    http.get('*/api/revisions/10', () => HttpResponse.json(r1)),
    http.get('*/api/revisions/11', () => HttpResponse.json(r2)),
    http.get('*/api/revisions/10/diff/11', () => HttpResponse.json(diff)),
  );
}

async function clickTab(root: HTMLElement, test: string): Promise<void> {
  root.querySelector<HTMLElement>(`[data-test="${test}"]`)!.click();
  await settle();
}

describe('RevisionComparePage', () => {
  it('lays inputs, gains and integer coefficients side by side with the changed rows marked', async () => {
    signInAs('reviewer');
    answerComparison();
    const { root } = await mountApp('/revisions/10/compare/11');
    await waitFor(() => root.querySelector('[data-test="side-inputs"]') !== null);
    expect(root.querySelector('[data-test="compare-title"]')!.textContent).toContain('r1 → r2');
    const inputs = root.querySelector('[data-test="side-inputs"]')!;
    // Inputs start with only the changes: exactly the inductance.
    const changedInputs = [...inputs.querySelectorAll('tbody tr[data-changed="yes"]')].map((tr) => tr.textContent ?? '');
    expect(changedInputs).toHaveLength(1);
    expect(changedInputs[0]).toContain('filter.inductanceH');
    expect(changedInputs[0]).toContain('0.0006');
    expect(changedInputs[0]).toContain('0.00075');
    const gains = [...root.querySelectorAll('[data-test="side-gains"] tbody tr[data-changed="yes"]')].map((tr) => tr.textContent ?? '');
    expect(gains).toHaveLength(1);
    expect(gains[0]).toContain('3.769911');
    expect(gains[0]).toContain('4.712389');
    const fixed = [...root.querySelectorAll('[data-test="side-fixed"] tbody tr[data-changed="yes"]')].map((tr) => tr.textContent ?? '');
    expect(fixed).toEqual([expect.stringContaining('[16384, -32760, 16381]')]);
    expect(root.querySelectorAll('[data-test="side-float"] tbody tr[data-changed="yes"]')).toHaveLength(0);
  });

  it('shows the server change list and the header diff with added and removed lines highlighted', async () => {
    signInAs('reviewer');
    answerComparison();
    const { root } = await mountApp('/revisions/10/compare/11');
    await waitFor(() => root.querySelector('[data-test="compare-tab-changes"]') !== null);
    await clickTab(root, 'compare-tab-changes');
    await waitFor(() => root.querySelector('[data-test="changes-fixed"]') !== null);
    expect(root.querySelector('[data-test="changes-fixed"]')!.textContent).toContain('-32761');
    await clickTab(root, 'compare-tab-header');
    await waitFor(() => root.querySelector('[data-test="header-diff"]') !== null);
    const lines = [...root.querySelectorAll('[data-test="header-diff"] [data-kind]')];
    const removed = lines.filter((l) => l.getAttribute('data-kind') === 'removed').map((l) => l.textContent ?? '');
    const added = lines.filter((l) => l.getAttribute('data-kind') === 'added').map((l) => l.textContent ?? '');
    expect(removed).toEqual([expect.stringContaining('-#define VS_PR_KP 3.77'), expect.stringContaining('-#define VS_PR_H1_A1 -32761')]);
    expect(added).toEqual([expect.stringContaining('+#define VS_PR_KP 4.71'), expect.stringContaining('+#define VS_PR_H1_A1 -32760')]);
    expect(lines[0].classList.contains('revision-diff-header__line--file')).toBe(true);
    expect(root.querySelector('[data-test="header-diff-stats"]')!.textContent).toMatch(/\+2\s*\/\s*−2/);
  });

  it('lets another reviewer approve, and sends the decision to the server', async () => {
    signInAs('reviewer');
    answerComparison();
    let body: unknown = null;
    server.use(http.post('*/api/revisions/11/reviews', async ({ request }) => {
      body = await request.json();
      return HttpResponse.json({ id: 1, revisionId: 11, reviewer: TEST_USERS.reviewer, decision: 'approve', comment: '', createdAt: '2026-12-01T10:00:00Z' }, { status: 201 });
    }));
    const { root } = await mountApp('/revisions/10/compare/11');
    await waitFor(() => root.querySelector('[data-test="review-approve"]') !== null);
    expect(root.querySelector('[data-test="review-blocked-reason"]')).toBeNull();
    root.querySelector<HTMLButtonElement>('[data-test="review-approve"]')!.click();
    await waitFor(() => body !== null);
    expect(body).toEqual({ decision: 'approve', comment: '' });
  });

  it('disables the verdict with the reason on the reviewer’s own revision', async () => {
    signInAs('reviewer');
    const own = { ...r2, author: { id: TEST_USERS.reviewer.id, name: TEST_USERS.reviewer.name, email: TEST_USERS.reviewer.email } };
    let posted = false;
    server.use(
      http.get('*/api/revisions/10', () => HttpResponse.json(r1)),
      http.get('*/api/revisions/11', () => HttpResponse.json(own)),
      http.get('*/api/revisions/10/diff/11', () => HttpResponse.json(diff)),
      http.post('*/api/revisions/11/reviews', () => { posted = true; return HttpResponse.json({}, { status: 201 }); }),
    );
    const { root } = await mountApp('/revisions/10/compare/11');
    await waitFor(() => root.querySelector('[data-test="review-blocked-reason"]') !== null);
    expect(root.querySelector('[data-test="review-blocked-reason"]')!.textContent).toContain('You wrote this revision');
    const approve = root.querySelector<HTMLButtonElement>('[data-test="review-approve"]')!;
    expect(approve.disabled || approve.getAttribute('aria-disabled') === 'true').toBe(true);
    approve.click();
    await settle();
    expect(posted).toBe(false);
  });

  it('requires a comment before sending back', async () => {
    signInAs('reviewer');
    answerComparison();
    let posted = false;
    server.use(http.post('*/api/revisions/11/reviews', () => { posted = true; return HttpResponse.json({}, { status: 201 }); }));
    const { root } = await mountApp('/revisions/10/compare/11');
    await waitFor(() => root.querySelector('[data-test="review-send-back"]') !== null);
    root.querySelector<HTMLButtonElement>('[data-test="review-send-back"]')!.click();
    await settle();
    expect(posted).toBe(false);
    expect(root.querySelector('[data-test="review-decision"]')!.textContent).toContain('Say what has to change');
  });

  it('shows the error when the server refuses the comparison', async () => {
    signInAs('engineer');
    server.use(
      http.get('*/api/revisions/10', () => HttpResponse.json(r1)),
      http.get('*/api/revisions/99', () => HttpResponse.json({ error: { code: 'not-found', message: 'revision 99 does not exist' } }, { status: 404 })),
      http.get('*/api/revisions/10/diff/99', () => HttpResponse.json({ error: { code: 'not-found', message: 'revision 99 does not exist' } }, { status: 404 })),
    );
    const { root } = await mountApp('/revisions/10/compare/99');
    await waitFor(() => root.querySelector('[data-test="compare-error"]') !== null);
    expect(root.querySelector('[data-test="compare-error"]')!.textContent).toContain('revision 99 does not exist');
    expect(root.querySelector('[data-test="review-decision"]')).toBeNull();
  });
});
