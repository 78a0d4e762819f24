// The comparison page: two revisions compared in the form's labels and engineering units (no key
// paths, no JSON, changes below display precision folded away), the overlaid plots, the
// highlighted header diff, and the verdict panel (disabled with the reason on one's own revision).
import { describe, expect, it, vi } from 'vitest';
import { http, HttpResponse } from 'msw';
import { createTwoFilesPatch } from 'diff';
import type { RevisionDetail } from '../../../src/api/types';
import type { RevisionDiff } from '../../../shared/api/revisions';
import { newDesignTemplate } from '../../../src/stores/designs';
import { buildAnalysis, buildAnalysisWithPlots } from '../analysisFixture';
import { buildRevisionSummary } from '../fixtures';
import { mountApp, settle, waitFor } from '../mountApp';
import { signInAs, TEST_USERS } from '../session';
import { server } from '../setup';
import type { AnalysisRunner } from '../../../src/composables/useLiveAnalysis';

function buildDetail(overrides: Partial<RevisionDetail>): RevisionDetail {
  return {
    ...buildRevisionSummary(), designName: 'Bay 4 rig', design: newDesignTemplate('Bay 4 rig'), analysis: buildAnalysis(), reviews: [], release: null,
    ...overrides,
  };
}

const r1 = buildDetail({ id: 10, number: 1, status: 'superseded', summary: 'First set' });
const base = newDesignTemplate('Bay 4 rig');
// The inductance changes; the voltage-loop crossover moves by rounding noise only.
const r2Design = { ...base, filter: { topology: 'L' as const, inductanceH: 0.00075, resistanceOhm: 0.03 }, voltageLoop: { ...base.voltageLoop, crossoverHz: 12.000001 } };
const r2Analysis = buildAnalysis();
r2Analysis.blocks[0].gains.kp = 4.712388980384690;
r2Analysis.blocks[0].sections[1].fixed.a = [16384, -32760, 16381];
r2Analysis.checks.push({ id: 'loop-current-phase-margin', severity: 'warning', message: 'Current loop phase margin 41.0° (target ≥ 45°).', value: 41, limit: 45, unit: 'deg', remedy: 'Lower the crossover target.' });
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

const { ChartStub } = vi.hoisted(() => ({ ChartStub: { name: 'VChartStub', props: { option: { type: Object, required: true } }, template: '<div class="chart-stub" :data-series="option.series.map((s) => s.name).join(\';\')" />' } }));
// happy-dom has no canvas: the chart is replaced and the options it would draw are checked.
vi.mock('vue-echarts', () => ({ default: ChartStub }));

/** Recomputed plot data for both revisions (a canned result, as the worker would answer). */
const plotRunner: AnalysisRunner = async (request) => ({ id: request.id, ok: true, result: buildAnalysisWithPlots(), elapsedMs: 0 });

async function clickTab(root: HTMLElement, test: string): Promise<void> {
  root.querySelector<HTMLElement>(`[data-test="${test}"]`)!.click();
  await settle();
}

describe('RevisionComparePage', { timeout: 30000 }, () => {
  it('speaks in the form\'s labels and units: only real changes, rounding noise folded away', async () => {
    signInAs('reviewer');
    answerComparison();
    const { root } = await mountApp('/revisions/10/compare/11');
    await waitFor(() => root.querySelector('[data-test="side-inputs"]') !== null);
    expect(root.querySelector('[data-test="compare-title"]')!.textContent).toContain('r1 → r2');
    const changedInputs = [...root.querySelectorAll('[data-test="side-inputs"] tbody tr[data-changed="yes"]')].map((tr) => tr.textContent ?? '');
    expect(changedInputs).toEqual([expect.stringMatching(/Inductance\s*0\.6 mH\s*0\.75 mH/)]);
    // 12 Hz → 12.000001 Hz reads the same: folded into one line, exact values on hover.
    const folded = root.querySelector<HTMLElement>('[data-test="side-inputs-folded"]')!;
    expect(folded.textContent).toContain('1 change below display precision');
    folded.click();
    await settle();
    const noise = root.querySelector('[data-test="side-inputs"] tr[data-status="below-precision"]')!;
    expect(noise.textContent).toContain('Target crossover');
    expect(noise.querySelectorAll('td')[2].getAttribute('title')).toBe('12.000001 Hz');
    const gains = [...root.querySelectorAll('[data-test="side-gains"] tbody tr[data-changed="yes"]')].map((tr) => tr.textContent ?? '');
    expect(gains).toEqual([expect.stringMatching(/proportional gain kp\s*3\.7699 V\/A\s*4\.7124 V\/A/)]);
    const fixed = [...root.querySelectorAll('[data-test="side-fixed"] tbody tr[data-changed="yes"]')].map((tr) => tr.textContent ?? '');
    expect(fixed).toEqual([expect.stringContaining('[16384, -32760, 16381]')]);
    expect(root.querySelectorAll('[data-test="side-float"] tbody tr[data-changed="yes"]')).toHaveLength(0);
    // Checks as their messages with severity.
    const checks = root.querySelector('[data-test="side-checks"] tr[data-status="added"]')!;
    expect(checks.textContent).toContain('Warning: Current loop phase margin 41.0° (target ≥ 45°).');
    // No key path and no JSON anywhere in the comparison.
    const text = root.querySelector('[data-test="compare-changes"]')!.textContent ?? '';
    expect(text).not.toMatch(/\b[a-z]+[A-Z][A-Za-z]*\.[a-z][A-Za-z]*\b/);
    expect(text).not.toMatch(/[{}"]/);
  });

  it('overlays both revisions\' plots and shows the header diff with added and removed lines', async () => {
    signInAs('reviewer');
    answerComparison();
    const { root } = await mountApp('/revisions/10/compare/11', { analysisRunner: plotRunner });
    await waitFor(() => root.querySelector('[data-test="tab-plots"]') !== null);
    await clickTab(root, 'tab-plots');
    await waitFor(() => root.querySelector('.chart-stub') !== null);
    // The Bode plot draws the newer revision solid and the older one dashed on the same axes.
    const series = root.querySelector('.chart-stub')!.getAttribute('data-series')!.split(';');
    expect(series).toEqual(['r2 |L|', 'r2 ∠L', 'r1 |L|', 'r1 ∠L']);
    await clickTab(root, 'tab-header');
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
