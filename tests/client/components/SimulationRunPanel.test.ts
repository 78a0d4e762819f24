// The workspace's time-domain run: options into the runner, progress and cancel, metrics and plots
// of the result, a stale mark when the design moves on. The runner is injected (no Worker here).
import { describe, expect, it, vi } from 'vitest';
import { mount, flushPromises } from '@vue/test-utils';
import { Quasar } from 'quasar';
import SimulationRunPanel from '../../../src/components/SimulationRunPanel.vue';
import { SIMULATION_RUNNER_KEY, type SimulationRunner } from '../../../src/composables/useSimulationRun';
import type { SimulationReply, SimulationRequest } from '../../../src/workers/simulationProtocol';
import { waitFor } from '../mountApp';
import { buildSimulationResult, sc3Design } from '../simulationFixture';

const { ChartStub } = vi.hoisted(() => ({ ChartStub: { name: 'VChartStub', props: { option: { type: Object, required: true } }, template: '<div class="chart-stub" />' } }));
vi.mock('vue-echarts', () => ({ default: ChartStub }));

function controllableRunner() {
  const calls: { request: SimulationRequest; progress: (f: number) => void; finish: (reply: SimulationReply) => void; cancelled: boolean }[] = [];
  const runner: SimulationRunner = (request, progress) => {
    let finish: (reply: SimulationReply) => void = () => {};
    const done = new Promise<SimulationReply>((resolve) => { finish = resolve; });
    const call = { request, progress, finish, cancelled: false };
    calls.push(call);
    return { done, cancel: () => { call.cancelled = true; finish({ id: request.id, kind: 'failed', message: 'cancelled', elapsedMs: 0 }); } };
  };
  return { runner, calls };
}

// Quasar puts attributes of q-input on the native input.
const field = (wrapper: ReturnType<typeof mount>, test: string) => wrapper.find(`input[data-test="${test}"]`);

async function settleAsync(): Promise<void> {
  for (let i = 0; i < 6; i++) { await flushPromises(); await new Promise((r) => setTimeout(r, 0)); }
}

const mountPanel = (runner: SimulationRunner, design = sc3Design()) => mount(SimulationRunPanel, {
  props: { design },
  global: { plugins: [Quasar], provide: { [SIMULATION_RUNNER_KEY as symbol]: runner } },
  attachTo: document.body,
});

describe('SimulationRunPanel', () => {
  it('runs the chosen scenario with progress, then shows the metrics and the five plots', async () => {
    const { runner, calls } = controllableRunner();
    const wrapper = mountPanel(runner);
    await field(wrapper, 'simulation-duration').setValue('0.2');
    await wrapper.find('[data-test="simulation-run"]').trigger('click');
    expect(calls).toHaveLength(1);
    expect(calls[0].request.options).toMatchObject({ scenario: 'steady', model: 'averaged', durationS: 0.2, coefficients: 'double', harmonicTable: 'ieee-519', quantization: 'firmware' });
    expect(calls[0].request.options).not.toHaveProperty('shortCircuitRatio');
    calls[0].progress(0.4);
    await flushPromises();
    expect(wrapper.find('[data-test="simulation-progress"]').exists()).toBe(true);
    expect(wrapper.text()).toContain('40 %');
    expect(wrapper.find('[data-test="simulation-cancel"]').exists()).toBe(true);
    const result = buildSimulationResult();
    calls[0].finish({ id: calls[0].request.id, kind: 'done', result, elapsedMs: 1234 });
    await settleAsync();
    expect(wrapper.find('[data-test="metric-pf"]').text()).toBe(String(Number(result.metrics.gridPowerFactor!.toPrecision(4))));
    expect(wrapper.find('[data-test="simulation-summary"]').text()).toContain('computed in 1.23 s');
    await waitFor(() => wrapper.findAllComponents(ChartStub).length === 5); // the plots are a lazy chunk
    expect(wrapper.findAllComponents(ChartStub)).toHaveLength(5);
    expect(wrapper.text()).not.toContain('the design has changed');
    wrapper.unmount();
  });

  it('cancels a run in flight and says nothing failed', async () => {
    const { runner, calls } = controllableRunner();
    const wrapper = mountPanel(runner);
    await wrapper.find('[data-test="simulation-run"]').trigger('click');
    await wrapper.find('[data-test="simulation-cancel"]').trigger('click');
    await flushPromises();
    expect(calls[0].cancelled).toBe(true);
    expect(wrapper.find('[data-test="simulation-run"]').exists()).toBe(true);
    expect(wrapper.find('[data-test="simulation-error"]').exists()).toBe(false);
    wrapper.unmount();
  });

  it('refuses a length outside 10 cycles to 10 s, passes a grid SCR, and marks a result stale when the design changes', async () => {
    const { runner, calls } = controllableRunner();
    const wrapper = mountPanel(runner);
    await field(wrapper, 'simulation-duration').setValue('0.05');
    expect(wrapper.find('[data-test="simulation-run"]').attributes('disabled')).toBeDefined();
    await field(wrapper, 'simulation-duration').setValue('');
    await field(wrapper, 'simulation-scr').setValue('5');
    await wrapper.find('[data-test="simulation-run"]').trigger('click');
    expect(calls[0].request.options.shortCircuitRatio).toBe(5);
    calls[0].finish({ id: calls[0].request.id, kind: 'done', result: buildSimulationResult(), elapsedMs: 10 });
    await flushPromises();
    const changed = sc3Design();
    changed.filter = { topology: 'L', inductanceH: 0.0007, resistanceOhm: 0.03 };
    await wrapper.setProps({ design: changed });
    expect(wrapper.text()).toContain('the design has changed since this run');
    wrapper.unmount();
  });

  it('shows why a run failed', async () => {
    const { runner, calls } = controllableRunner();
    const wrapper = mountPanel(runner);
    await wrapper.find('[data-test="simulation-run"]').trigger('click');
    calls[0].finish({ id: calls[0].request.id, kind: 'failed', message: 'the closed loop diverged at t = 0.1 s', elapsedMs: 5 });
    await flushPromises();
    expect(wrapper.find('[data-test="simulation-error"]').text()).toContain('diverged');
    wrapper.unmount();
  });
});
