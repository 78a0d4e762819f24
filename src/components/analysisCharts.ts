// ECharts, tree-shaken: only the charts, components and renderer the workspace plots use.
// Imported only by the lazy plot components, so none of it is in the sign-in route.
import { use } from 'echarts/core';
import { LineChart, ScatterChart } from 'echarts/charts';
import { GridComponent, LegendComponent, MarkLineComponent, MarkPointComponent, TitleComponent, TooltipComponent } from 'echarts/components';
import { CanvasRenderer } from 'echarts/renderers';

use([LineChart, ScatterChart, GridComponent, LegendComponent, MarkLineComponent, MarkPointComponent, TitleComponent, TooltipComponent, CanvasRenderer]);

/** Series colours of the Varsmith palette. */
export const PLOT_COLORS = ['#c27a4a', '#1e2a3a', '#3d78a8', '#2f8a5f', '#d08a10', '#8a4f9e'];

/** Axis and text styling shared by all plots. */
export const AXIS_STYLE = {
  axisLine: { lineStyle: { color: '#6b6f76' } },
  splitLine: { lineStyle: { color: '#e3ded6' } },
  axisLabel: { color: '#3a3f46' },
  nameTextStyle: { color: '#3a3f46' },
} as const;

/**
 * Grid options shared by all plots: the margins are fixed in pixels (wide enough for the tick labels
 * and axis names), so ECharts is told not to re-measure the labels to fit them on every redraw.
 */
export const FIXED_GRID = { outerBoundsMode: 'none' } as const;

/**
 * Series data as one interleaved typed array `[x0, y0, x1, y1, …]`: ECharts copies it in one go
 * instead of cloning and reading hundreds of little `[x, y]` arrays on every redraw.
 * @param x - abscissae.
 * @param y - ordinates, same length.
 * @param scaleX - factor applied to x (e.g. 1000 for seconds to ms).
 * @returns the interleaved values.
 */
export function xyData(x: readonly number[], y: readonly number[], scaleX = 1): Float64Array {
  const out = new Float64Array(2 * x.length);
  for (let i = 0; i < x.length; i += 1) {
    out[2 * i] = x[i] * scaleX;
    out[2 * i + 1] = y[i];
  }
  return out;
}

/** Line styles of overlaid traces: the first (newer) solid, the second (older) dashed. */
export const TRACE_LINE_TYPES = ['solid', 'dashed'] as const;

/**
 * CSV text (RFC 4180): a header line and one line per row; fields with a comma, quote or line
 * break are quoted. Numbers are written in full precision.
 * @param header - column names.
 * @param rows - the rows.
 * @returns the text, lines ended by CRLF.
 */
export function toCsv(header: readonly string[], rows: readonly (readonly (string | number | null)[])[]): string {
  const field = (v: string | number | null): string => {
    const text = v === null ? '' : String(v);
    return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
  };
  return [header, ...rows].map((row) => row.map(field).join(',')).join('\r\n') + '\r\n';
}

/**
 * The unit written in parentheses in a response label (`inverter current (A) for a 1 A step` → `A`).
 * @param label - the label of a time response.
 * @returns the unit, or null when the label names none.
 */
export function unitOfLabel(label: string): string | null {
  const match = /\(([^)]+)\)/.exec(label);
  return match ? match[1] : null;
}
