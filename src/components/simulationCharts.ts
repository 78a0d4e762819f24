// Chart options of the time-domain run (ECharts, tree-shaken like the analysis plots, plus the
// bar chart of the harmonics). Pure functions of the result, so tests check what would be drawn.
import { use } from 'echarts/core';
import { BarChart } from 'echarts/charts';
import type { SimulationResult, SimulationTraces } from '../../shared/simulation';
import { formatNumber, formatQuantity } from '../composables/format';
import { AXIS_STYLE, FIXED_GRID, PLOT_COLORS, xyData } from './analysisCharts';

use([BarChart]);

/** One line of a time plot: which trace, its legend name, left (0) or right (1) axis. */
export interface TraceLine {
  trace: keyof Omit<SimulationTraces, 'timeS'>;
  name: string;
  axis: 0 | 1;
  dashed?: boolean;
}

const formatter = (v: number) => formatNumber(v, 4);

/**
 * Line plot of traces against time in milliseconds, one or two y axes.
 * @param traces - the run's traces.
 * @param lines - what to draw (traces that are null are left out).
 * @param axisNames - names of the left and (optionally) right axes, with units.
 * @param marks - horizontal reference lines on the left axis (value and label).
 * @returns the ECharts option.
 */
export function timePlotOption(traces: SimulationTraces, lines: TraceLine[], axisNames: [string, string?], marks: { value: number; name: string }[] = []) {
  const drawn = lines.filter((l) => traces[l.trace] !== null);
  const yAxis = axisNames.filter((n): n is string => n !== undefined).map((name, i) => ({
    type: 'value' as const, name, scale: true, position: i === 0 ? 'left' : 'right', nameTextStyle: AXIS_STYLE.nameTextStyle,
    axisLine: AXIS_STYLE.axisLine, splitLine: i === 0 ? AXIS_STYLE.splitLine : { show: false }, axisLabel: { ...AXIS_STYLE.axisLabel, formatter },
  }));
  const last = traces.timeS.length > 0 ? traces.timeS[traces.timeS.length - 1] * 1000 : 1;
  return {
    animation: false,
    color: PLOT_COLORS,
    legend: { top: 0, data: drawn.map((l) => l.name) },
    tooltip: { trigger: 'axis', valueFormatter: formatter },
    grid: { ...FIXED_GRID, left: 64, right: axisNames[1] ? 64 : 16, top: 36, bottom: 44 },
    xAxis: { type: 'value', name: 'time (ms)', nameLocation: 'middle', nameGap: 26, min: 0, max: Number(last.toPrecision(6)), ...AXIS_STYLE },
    yAxis,
    series: drawn.map((l, i) => ({
      type: 'line',
      name: l.name,
      yAxisIndex: l.axis,
      showSymbol: false,
      lineStyle: { width: 1.2, ...(l.dashed ? { type: 'dashed' } : {}) },
      data: xyData(traces.timeS, traces[l.trace] as number[], 1000),
      ...(i === 0 && marks.length > 0 ? { markLine: { symbol: 'none', silent: true, data: marks.map((m) => ({ yAxis: m.value, name: m.name })), label: { formatter: '{b}' } } } : {}),
    })),
  };
}

/** Bars of the grid-current harmonics and the limit of each order, both in percent of the fundamental. */
export interface HarmonicBars {
  orders: number[];
  valuePercent: number[];
  limitPercent: (number | null)[];
  pass: boolean[];
}

/**
 * The harmonics against the chosen table, in percent of the fundamental: IEEE 519 limits are
 * percent of I_L (taken as the fundamental); IEC 61000-3-2 limits in A rms are divided by the
 * fundamental's rms.
 * @param result - the run.
 * @returns orders, values, limits and verdicts.
 */
export function harmonicBars(result: SimulationResult): HarmonicBars {
  const fundamentalRmsA = result.metrics.gridCurrentFundamentalRmsA;
  const rows = result.harmonicLimits.rows;
  return {
    orders: rows.map((r) => r.harmonic),
    valuePercent: rows.map((r) => r.valuePercent),
    limitPercent: rows.map((r) => (r.limitPercent !== null ? r.limitPercent : r.limitRmsA !== null && fundamentalRmsA > 0 ? (100 * r.limitRmsA) / fundamentalRmsA : null)),
    pass: rows.map((r) => r.pass),
  };
}

/**
 * Bar chart of the grid-current harmonics (a bar per order, red when over its limit) with the limits as marks.
 * @param result - the run.
 * @returns the ECharts option.
 */
export function harmonicPlotOption(result: SimulationResult) {
  const bars = harmonicBars(result);
  return {
    animation: false,
    color: PLOT_COLORS,
    legend: { top: 0, data: ['simulated', 'limit'] },
    tooltip: { trigger: 'axis', valueFormatter: (v: number) => formatQuantity(v, '%', 3) },
    grid: { ...FIXED_GRID, left: 64, right: 16, top: 36, bottom: 44 },
    xAxis: { type: 'category', name: 'harmonic order', nameLocation: 'middle', nameGap: 26, data: bars.orders.map(String), ...AXIS_STYLE },
    yAxis: { type: 'log', name: '% of fundamental', min: 0.001, ...AXIS_STYLE, axisLabel: { ...AXIS_STYLE.axisLabel, formatter } },
    series: [
      {
        type: 'bar',
        name: 'simulated',
        barMaxWidth: 12,
        data: bars.valuePercent.map((v, i) => ({ value: Math.max(v, 0.001), itemStyle: { color: bars.pass[i] ? PLOT_COLORS[2] : '#c0392b' } })),
      },
      {
        type: 'line',
        name: 'limit',
        step: 'middle',
        showSymbol: false,
        lineStyle: { color: PLOT_COLORS[0], width: 1.5 },
        data: bars.limitPercent,
      },
    ],
  };
}
