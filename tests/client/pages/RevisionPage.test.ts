// The page of one revision against msw: a reviewer of a first revision sees the plant values in the
// form's units, the findings and the plots (recomputed from the frozen inputs), and records a
// verdict there; the author reads the comments; a released revision links to its release; testers
// are refused, as the API refuses them.
import { describe, expect, it, vi } from 'vitest';
import { http, HttpResponse } from 'msw';
import type { RevisionListItem } from '../../../src/api/revisions';
import type { RevisionDetail } from '../../../src/api/types';
import type { AnalysisRunner } from '../../../src/composables/useLiveAnalysis';
import { newDesignTemplate } from '../../../src/stores/designs';
import { buildAnalysis, buildAnalysisWithPlots } from '../analysisFixture';
import { buildRevisionSummary } from '../fixtures';
import { buildSimulationResult } from '../simulationFixture';
import { mountApp, settle, waitFor } from '../mountApp';
import { signInAs, TEST_USERS } from '../session';
import { server } from '../setup';

const { ChartStub } = vi.hoisted(() => ({ ChartStub: { name: 'VChartStub', props: { option: { type: Object, required: true } }, template: '<div class="chart-stub" />' } }));
// happy-dom has no canvas: the chart is replaced.
vi.mock('vue-echarts', () => ({ default: ChartStub }));

const lcl = {
  ...newDesignTemplate('Quay 2 LCL'),
  filter: { topology: 'LCL' as const, inverterInductanceH: 1e-3, gridInductanceH: 0.5e-3, capacitanceF: 8.2e-6, dampingResistanceOhm: 2, resistanceOhm: 0.05 },
};

function detail(overrides: Partial<RevisionDetail> = {}): RevisionDetail {
  return {
    ...buildRevisionSummary({ id: 11, designId: 7, number: 1, status: 'in-review', summary: 'First LCL set' }),
    designName: 'Quay 2 LCL', design: lcl, analysis: buildAnalysis(), reviews: [], release: null, ...overrides,
  };
}

/** Query of the last history request (the page asks only for the revisions before the one shown). */
let historyQuery: URLSearchParams | null = null;

function answer(revision: RevisionDetail, history: RevisionListItem[] = [{ ...revision, reviews: revision.reviews }]): void {
  server.use(
    http.get(`*/api/revisions/${revision.id}`, () => HttpResponse.json(revision)),
    http.get(`*/api/designs/${revision.designId}/revisions`, ({ request }) => {
      historyQuery = new URL(request.url).searchParams;
      const before = Number(historyQuery.get('before') ?? Infinity);
      return HttpResponse.json(history.filter((r) => r.number < before).slice(0, Number(historyQuery.get('limit') ?? 50)));
    }),
  );
}

const plotRunner: AnalysisRunner = async (request) => ({ id: request.id, ok: true, result: buildAnalysisWithPlots(), elapsedMs: 0 });

async function clickTab(root: HTMLElement, name: string): Promise<void> {
  root.querySelector<HTMLElement>(`[data-test="tab-${name}"]`)!.click();
  await settle();
}

describe('RevisionPage', { timeout: 30000 }, () => {
  it('shows a reviewer the plant values of a first revision, its findings and plots, and the verdict panel', async () => {
    signInAs('reviewer');
    answer(detail());
    const { root } = await mountApp('/revisions/11', { analysisRunner: plotRunner });
    await waitFor(() => root.querySelector('[data-test="revision-inputs"]') !== null);
    expect(root.querySelector('[data-test="revision-title"]')!.textContent).toContain('Quay 2 LCL · r1');
    const inputs = root.querySelector('[data-test="revision-inputs"]')!;
    expect(inputs.querySelector('[data-key="filter.inverterInductanceH"]')!.textContent).toMatch(/Inverter-side inductance L1\s*1 mH/);
    expect(inputs.querySelector('[data-key="filter.capacitanceF"]')!.textContent).toMatch(/Filter capacitance Cf\s*8\.2 µF/);
    expect(inputs.querySelector('[data-key="filter.capacitanceF"] td')!.getAttribute('title')).toBe('0.0000082 F');
    expect(root.textContent).toContain('First revision of this design');
    expect(root.querySelector('[data-test="revision-compare-previous"]')).toBeNull();
    expect(root.querySelector('[data-test="review-decision"]')).not.toBeNull();
    await clickTab(root, 'findings');
    await waitFor(() => root.querySelector('[data-test="findings"]') !== null);
    expect(root.querySelector('[data-test="findings"]')!.textContent).toContain('Resonance h1 moves 2.61 Hz');
    await clickTab(root, 'shape');
    await waitFor(() => root.querySelector('.chart-stub') !== null);
  });

  it('shows a reviewer the stored time-domain run of the revision (shipped coefficients) in its own tab', async () => {
    signInAs('reviewer');
    answer(detail());
    let asked: string | null = null;
    server.use(http.get('*/api/revisions/11/simulation', ({ request }) => {
      asked = new URL(request.url).search;
      return HttpResponse.json({
        revisionId: 11, scenario: 'steady', model: 'averaged', harmonicTable: 'ieee-519', coefficients: 'quantized',
        toolVersion: '0.1.0', computedAt: '2026-12-02T12:00:00.000Z', result: buildSimulationResult(),
      });
    }));
    const { root } = await mountApp('/revisions/11', { analysisRunner: plotRunner });
    await waitFor(() => root.querySelector('[data-test="revision-inputs"]') !== null);
    expect(asked).toBeNull(); // nothing is computed before the tab is opened
    await clickTab(root, 'run');
    await waitFor(() => root.querySelector('[data-test="revision-simulation-stamp"]') !== null);
    expect(asked).toBe('?scenario=steady&model=averaged&harmonicTable=ieee-519&coefficients=quantized');
    expect(root.querySelector('[data-test="revision-simulation"]')!.textContent).toContain('Time-domain run of r1');
    expect(root.querySelector('[data-test="metric-pf"]')).not.toBeNull();
  });

  it('records the verdict of another reviewer from the page', async () => {
    signInAs('reviewer');
    const revision = detail();
    answer(revision);
    let body: unknown = null;
    server.use(http.post('*/api/revisions/11/reviews', async ({ request }) => {
      body = await request.json();
      return HttpResponse.json({ id: 5, revisionId: 11, reviewer: TEST_USERS.reviewer, decision: 'changes', comment: 'Lower Cf to 6.8 µF.', createdAt: '2026-12-01T10:00:00Z' }, { status: 201 });
    }));
    const { root } = await mountApp('/revisions/11');
    await waitFor(() => root.querySelector('[data-test="review-comment"]') !== null);
    const comment = root.querySelector<HTMLTextAreaElement>('[data-test="review-comment"] textarea, textarea[data-test="review-comment"]')!;
    comment.value = 'Lower Cf to 6.8 µF.';
    comment.dispatchEvent(new Event('input'));
    await settle();
    root.querySelector<HTMLElement>('[data-test="review-send-back"]')!.click();
    await waitFor(() => body !== null);
    expect(body).toEqual({ decision: 'changes', comment: 'Lower Cf to 6.8 µF.' });
  });

  it('shows the author the comments and links a released revision to its release and to the previous one', async () => {
    signInAs('engineer');
    const reviews = [{ id: 5, revisionId: 12, reviewer: { id: 2, name: 'Rui Reviewer', email: 'reviewer@varsmith.test' }, decision: 'approve' as const, comment: 'Margins fine now.', createdAt: '2026-12-01T10:00:00Z' }];
    const r2 = detail({ id: 12, number: 2, status: 'released', reviews, release: { id: 3, version: '1.2.0' } });
    const r1 = { ...buildRevisionSummary({ id: 11, designId: 7, number: 1, status: 'changes-requested' }), reviews: [] };
    answer(r2, [{ ...r2 }, r1]);
    const { root } = await mountApp('/revisions/12');
    await waitFor(() => root.querySelector('[data-test="revision-release-link"]') !== null);
    expect(root.querySelector('[data-test="revision-release-link"]')!.getAttribute('href')).toBe('/releases/3');
    expect(root.querySelector('[data-test="revision-release-link"]')!.textContent).toContain('1.2.0');
    expect(root.querySelector('[data-test="revision-reviews"]')!.textContent).toContain('Margins fine now.');
    await waitFor(() => root.querySelector('[data-test="revision-compare-previous"]') !== null);
    expect(root.querySelector('[data-test="revision-compare-previous"]')!.getAttribute('href')).toBe('/revisions/11/compare/12');
    expect(Object.fromEntries(historyQuery!.entries())).toEqual({ before: '2', limit: '1', offset: '0' });
    expect(root.querySelector('[data-test="review-decision"]')).toBeNull();
  });

  it('sends a tester elsewhere: revisions are not theirs to read', async () => {
    signInAs('tester');
    server.use(http.get('*/api/releases', () => HttpResponse.json([])));
    const { router } = await mountApp('/revisions/11');
    await waitFor(() => router.currentRoute.value.name === 'releases');
    expect(router.currentRoute.value.query.refused).toBe('revision');
  });
});
