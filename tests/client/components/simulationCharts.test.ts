// What the time-domain plots would draw: traces in milliseconds, missing controller traces left out,
// harmonics in percent of the fundamental against the table's limits (IEC amperes converted).
import { describe, expect, it } from 'vitest';
import { harmonicBars, harmonicPlotOption, timePlotOption } from '../../../src/components/simulationCharts';
import { expectClose } from '../../helpers/expectClose';
import { buildSimulationResult } from '../simulationFixture';

describe('simulation charts', () => {
  const result = buildSimulationResult();

  it('plots traces against time in ms on one or two axes, and leaves out traces the controller did not log', () => {
    const traces = { ...result.traces, pllAngleErrorDeg: null };
    const option = timePlotOption(traces, [
      { trace: 'pllFrequencyHz', name: 'f', axis: 0 },
      { trace: 'pllAngleErrorDeg', name: 'angle', axis: 1 },
    ], ['Hz', '°'], [{ value: 60, name: '60 Hz' }]);
    expect(option.series.map((s) => s.name)).toEqual(['f']);
    expect(option.yAxis).toHaveLength(2);
    const data = option.series[0].data as Float64Array;
    expectClose(data[2], result.traces.timeS[1] * 1000, { rtol: 1e-12 }, 'time in ms');
    expectClose(data[3], result.traces.pllFrequencyHz![1], { rtol: 0 }, 'value');
    expect((option.series[0] as { markLine?: { data: unknown[] } }).markLine?.data).toEqual([{ yAxis: 60, name: '60 Hz' }]);
  });

  it('IEEE 519: bars in percent of the fundamental, limits as the table gives them', () => {
    const bars = harmonicBars(result);
    expect(bars.orders[0]).toBe(2);
    expect(bars.orders[bars.orders.length - 1]).toBe(50);
    expectClose(bars.valuePercent[1], result.metrics.gridCurrentHarmonicsPercent['3'], { rtol: 1e-12 }, 'h3');
    expect(bars.limitPercent[1]).toBe(15); // Isc/IL >= 1000 row, 3 <= h < 11 (stiff grid)
    const option = harmonicPlotOption(result);
    expect(option.series.map((s) => s.type)).toEqual(['bar', 'line']);
  });

  it('IEC 61000-3-2: limits in A rms become percent of the fundamental rms', () => {
    const iec = buildSimulationResult({ harmonicTable: 'iec-61000-3-2-class-a' });
    const bars = harmonicBars(iec);
    const i3 = bars.orders.indexOf(3);
    expectClose(bars.limitPercent[i3] ?? NaN, (100 * 2.3) / iec.metrics.gridCurrentFundamentalRmsA, { rtol: 1e-12 }, 'h3 limit');
  });
});
