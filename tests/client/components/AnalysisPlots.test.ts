// The plot options handed to ECharts (the chart itself is stubbed: happy-dom has no canvas):
// Bode with crossover and phase-margin marks, steps in milliseconds, z plane with the unit circle.
import { describe, expect, it, vi } from 'vitest';
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import AnalysisPlotsBode from '../../../src/components/AnalysisPlotsBode.vue';
import AnalysisPlotsPoleMap from '../../../src/components/AnalysisPlotsPoleMap.vue';
import AnalysisPlotsStep from '../../../src/components/AnalysisPlotsStep.vue';
import { buildAnalysisWithPlots } from '../analysisFixture';
import { expectClose } from '../../helpers/expectClose';

type Option = Record<string, unknown> & { series: Record<string, unknown>[] };
const { ChartStub } = vi.hoisted(() => ({ ChartStub: { name: 'VChartStub', props: { option: { type: Object, required: true } }, template: '<div class="chart-stub" />' } }));
// happy-dom has no canvas: the chart component is replaced; the options it would draw are checked.
vi.mock('vue-echarts', () => ({ default: ChartStub }));
const global = { plugins: [Quasar] };

function optionOf(wrapper: ReturnType<typeof mount>): Option {
  return wrapper.findComponent(ChartStub).props('option') as Option;
}

describe('analysis plots', () => {
  const result = buildAnalysisWithPlots();

  it('draws magnitude and phase on log axes with the crossover and the phase margin marked', () => {
    const wrapper = mount(AnalysisPlotsBode, { props: { loop: result.loops[0], response: result.responses!.openLoop.current }, global });
    const option = optionOf(wrapper);
    expect((option.xAxis as { type: string }[]).map((a) => a.type)).toEqual(['log', 'log']);
    const [magnitude, phase] = option.series as { data: Float64Array; markLine: { data: Record<string, unknown>[] }; markPoint?: { data: { coord: number[]; value: string }[] } }[];
    expect(magnitude.data).toHaveLength(2 * 41); // interleaved [f0, |L|0, f1, |L|1, …]
    const response = result.responses!.openLoop.current;
    expectClose(Array.from(magnitude.data.filter((_, i) => i % 2 === 0)), response.frequencyHz, { rtol: 0 });
    expectClose(Array.from(phase.data.filter((_, i) => i % 2 === 1)), response.phaseDeg, { rtol: 0 });
    expect(magnitude.markLine.data).toContainEqual({ yAxis: 0, name: '0 dB' });
    expect(magnitude.markLine.data).toContainEqual({ xAxis: 1000, name: 'fc 1 kHz' });
    expect(phase.markLine.data).toContainEqual({ yAxis: -180, name: '−180°' });
    expect(phase.markPoint!.data[0].value).toBe('PM 90°');
    expectClose(phase.markPoint!.data[0].coord, [1000, -90], { rtol: 1e-12 });
    expect(magnitude.markPoint).toBeUndefined();
    expect(wrapper.find('.chart-stub').exists()).toBe(true);
  });

  it('plots each step response against time in milliseconds', () => {
    const wrapper = mount(AnalysisPlotsStep, { props: { time: result.responses!.time }, global });
    const option = optionOf(wrapper);
    const data = (option.series[0] as { data: Float64Array }).data;
    expectClose(Array.from(data.filter((_, i) => i % 2 === 0)), [0, 0.05, 0.1], { rtol: 1e-12 });
    expectClose(Array.from(data.filter((_, i) => i % 2 === 1)), result.responses!.time[Object.keys(result.responses!.time)[0]].value, { rtol: 0 });
    expect(wrapper.text()).toContain('Current reference step');
  });

  it('draws the unit circle, closed-loop poles and open-loop poles and zeros', () => {
    const wrapper = mount(AnalysisPlotsPoleMap, { props: { loop: result.loops[0], poleZero: result.responses!.poleZero!.current }, global });
    const option = optionOf(wrapper);
    const names = option.series.map((s) => s.name);
    expect(names).toEqual(['unit circle', 'closed-loop poles', 'open-loop poles', 'open-loop zeros']);
    const circle = (option.series[0] as { data: number[][] }).data;
    circle.forEach(([re, im]) => expectClose(Math.hypot(re, im), 1, { rtol: 1e-12 }));
    expect((option.series[1] as { data: number[][] }).data).toEqual(result.loops[0].closedLoopPoles);
  });

  it('says so when a loop has no frequency response', () => {
    const wrapper = mount(AnalysisPlotsBode, { props: { loop: result.loops[0], response: null }, global });
    expect(wrapper.text()).toContain('No frequency response');
  });
});
