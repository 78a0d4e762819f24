// A revision's stored run: the card asks the server for the chosen scenario (shipped coefficients)
// and shows when and by what version it was computed, with the metrics and plots.
import { describe, expect, it, vi } from 'vitest';
import { mount, flushPromises } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { http, HttpResponse } from 'msw';
import RevisionSimulationCard from '../../../src/components/RevisionSimulationCard.vue';
import type { RevisionRun } from '../../../shared/api/simulation';
import { waitFor } from '../mountApp';
import { buildSimulationResult } from '../simulationFixture';
import { server } from '../setup';

const { ChartStub } = vi.hoisted(() => ({ ChartStub: { name: 'VChartStub', props: { option: { type: Object, required: true } }, template: '<div class="chart-stub" />' } }));
vi.mock('vue-echarts', () => ({ default: ChartStub }));

describe('RevisionSimulationCard', () => {
  it('loads the stored run of the revision with the shipped coefficients and shows it', async () => {
    const asked: URLSearchParams[] = [];
    server.use(http.get('*/api/revisions/7/simulation', ({ request }) => {
      const query = new URL(request.url).searchParams;
      asked.push(query);
      const run: RevisionRun = {
        revisionId: 7, scenario: query.get('scenario') ?? '', model: 'averaged', harmonicTable: 'ieee-519', coefficients: 'quantized',
        toolVersion: '0.1.0', computedAt: '2026-12-02T12:00:00.000Z', result: buildSimulationResult(),
      };
      return HttpResponse.json(run);
    }));
    const wrapper = mount(RevisionSimulationCard, { props: { revisionId: 7, revisionNumber: 3 }, global: { plugins: [Quasar] } });
    for (let i = 0; i < 8; i++) { await flushPromises(); await new Promise((r) => setTimeout(r, 0)); }
    expect(asked).toHaveLength(1);
    expect(Object.fromEntries(asked[0])).toEqual({ scenario: 'steady', model: 'averaged', harmonicTable: 'ieee-519', coefficients: 'quantized' });
    expect(wrapper.text()).toContain('Time-domain run of r3');
    expect(wrapper.find('[data-test="revision-simulation-stamp"]').text()).toContain('Varsmith 0.1.0');
    expect(wrapper.find('[data-test="simulation-metrics"]').exists()).toBe(true);
    await waitFor(() => wrapper.findAllComponents(ChartStub).length === 5); // the plots are a lazy chunk
    expect(wrapper.findAllComponents(ChartStub)).toHaveLength(5);
  });

  it('says why a run could not be loaded', async () => {
    server.use(http.get('*/api/revisions/8/simulation', () => HttpResponse.json({ error: { code: 'over-budget', message: 'the simulation ran longer than its budget' } }, { status: 422 })));
    const wrapper = mount(RevisionSimulationCard, { props: { revisionId: 8 }, global: { plugins: [Quasar] } });
    for (let i = 0; i < 8; i++) { await flushPromises(); await new Promise((r) => setTimeout(r, 0)); }
    expect(wrapper.text()).toContain('ran longer than its budget');
  });
});
