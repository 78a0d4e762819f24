// Row builders of the revision comparison: two frozen revisions laid out side by side, and the
// unified header diff split into typed lines with old/new line numbers.
import type { AnalysisResult, DesignInput } from '../../shared/control';

/** One compared value: the path, the value in each revision and whether they differ. */
export interface SideBySideRow {
  path: string;
  before: unknown;
  after: unknown;
  changed: boolean;
}

/**
 * Flattens a JSON value into leaf paths (`filter.inductanceH`, `currentLoop.harmonics`); arrays of
 * numbers stay whole so a list of harmonics reads as one value.
 * @param value - any JSON value.
 * @param prefix - path so far.
 * @param out - accumulator.
 * @returns the map from path to leaf value.
 */
export function flattenLeaves(value: unknown, prefix = '', out: Map<string, unknown> = new Map()): Map<string, unknown> {
  const isPlainObject = value !== null && typeof value === 'object' && !Array.isArray(value);
  const isObjectArray = Array.isArray(value) && value.some((v) => v !== null && typeof v === 'object');
  if (isPlainObject) {
    for (const [key, inner] of Object.entries(value as Record<string, unknown>)) flattenLeaves(inner, prefix ? `${prefix}.${key}` : key, out);
  } else if (isObjectArray) {
    (value as unknown[]).forEach((inner, i) => flattenLeaves(inner, `${prefix}[${i}]`, out));
  } else {
    out.set(prefix, value);
  }
  return out;
}

/**
 * Equality of two leaf values by their JSON text (numbers compare exactly, as stored).
 * @param x - a leaf.
 * @param y - another leaf.
 * @returns whether they are the same value.
 */
export function sameValue(x: unknown, y: unknown): boolean {
  return JSON.stringify(x ?? null) === JSON.stringify(y ?? null);
}

/**
 * Pairs two flattened maps by path, in the order of first appearance (before, then new paths of after).
 * @param before - leaves of the older revision.
 * @param after - leaves of the newer revision.
 * @returns one row per path.
 */
export function pairLeaves(before: Map<string, unknown>, after: Map<string, unknown>): SideBySideRow[] {
  const paths = [...before.keys(), ...[...after.keys()].filter((k) => !before.has(k))];
  return paths.map((path) => {
    const b = before.has(path) ? before.get(path) : undefined;
    const a = after.has(path) ? after.get(path) : undefined;
    return { path, before: b, after: a, changed: !sameValue(b, a) };
  });
}

/**
 * Design inputs side by side.
 * @param before - the older design.
 * @param after - the newer design.
 * @returns rows per leaf path.
 */
export function inputRows(before: DesignInput, after: DesignInput): SideBySideRow[] {
  return pairLeaves(flattenLeaves(before), flattenLeaves(after));
}

function gainLeaves(analysis: AnalysisResult): Map<string, unknown> {
  const out = new Map<string, unknown>();
  for (const block of analysis.blocks) {
    for (const [key, value] of Object.entries(block.gains)) out.set(`${block.id}.${key}`, value);
  }
  return out;
}

/**
 * Gains in use per block, side by side.
 * @param before - analysis of the older revision.
 * @param after - analysis of the newer revision.
 * @returns rows `block.gain`.
 */
export function gainRows(before: AnalysisResult, after: AnalysisResult): SideBySideRow[] {
  return pairLeaves(gainLeaves(before), gainLeaves(after));
}

function coefficientLeaves(analysis: AnalysisResult, kind: 'float' | 'fixed'): Map<string, unknown> {
  const out = new Map<string, unknown>();
  for (const block of analysis.blocks) {
    for (const section of block.sections) {
      const key = `${block.id}/${section.role}`;
      if (kind === 'float') {
        out.set(`${key}.b`, section.b);
        out.set(`${key}.a`, section.a);
      } else {
        out.set(`${key}.format`, section.fixed.qFormat);
        out.set(`${key}.b`, section.fixed.b);
        out.set(`${key}.a`, section.fixed.a);
      }
    }
  }
  return out;
}

/**
 * Section coefficients side by side, as doubles or as the quantized integers with their Q format.
 * @param before - analysis of the older revision.
 * @param after - analysis of the newer revision.
 * @param kind - `float` (b, a) or `fixed` (format, integer b, integer a).
 * @returns rows `block/section.b` etc.
 */
export function coefficientRows(before: AnalysisResult, after: AnalysisResult, kind: 'float' | 'fixed'): SideBySideRow[] {
  return pairLeaves(coefficientLeaves(before, kind), coefficientLeaves(after, kind));
}

function marginLeaves(analysis: AnalysisResult): Map<string, unknown> {
  const out = new Map<string, unknown>();
  for (const loop of analysis.loops) {
    out.set(`${loop.id}.crossoverHz`, loop.crossoverHz);
    out.set(`${loop.id}.phaseMarginDeg`, loop.phaseMarginDeg);
    out.set(`${loop.id}.gainMarginDb`, loop.gainMarginDb);
    out.set(`${loop.id}.peakSensitivity`, loop.peakSensitivity);
    out.set(`${loop.id}.maxPoleRadius`, loop.maxPoleRadius);
    out.set(`${loop.id}.stable`, loop.stable);
  }
  return out;
}

/**
 * Loop margins side by side.
 * @param before - analysis of the older revision.
 * @param after - analysis of the newer revision.
 * @returns rows `loop.metric`.
 */
export function marginRows(before: AnalysisResult, after: AnalysisResult): SideBySideRow[] {
  return pairLeaves(marginLeaves(before), marginLeaves(after));
}

function checkLeaves(analysis: AnalysisResult): Map<string, unknown> {
  const out = new Map<string, unknown>();
  for (const check of analysis.checks) out.set(check.id, `${check.severity}: ${check.message}`);
  return out;
}

/**
 * Checks side by side by id: severity and message; absent on one side means added or removed.
 * @param before - analysis of the older revision.
 * @param after - analysis of the newer revision.
 * @returns rows per check id.
 */
export function checkRows(before: AnalysisResult, after: AnalysisResult): SideBySideRow[] {
  return pairLeaves(checkLeaves(before), checkLeaves(after));
}

/**
 * How a compared value reads in a cell: numbers to 7 significant digits (integers exact), arrays
 * comma-separated, absent as an em dash.
 * @param value - the value.
 * @returns display text.
 */
export function formatCell(value: unknown): string {
  if (value === undefined) return '—';
  if (value === null) return 'none';
  if (typeof value === 'number') return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(7)));
  if (Array.isArray(value)) return `[${value.map((v) => formatCell(v)).join(', ')}]`;
  if (typeof value === 'object') return JSON.stringify(value);
  return String(value);
}

/** Kinds of lines in a unified diff. */
export type DiffLineKind = 'file' | 'hunk' | 'added' | 'removed' | 'context' | 'note';

/** One line of a unified diff with its line numbers in the old and new text. */
export interface DiffLine {
  kind: DiffLineKind;
  text: string;
  oldLine: number | null;
  newLine: number | null;
}

/**
 * Splits a unified diff into typed lines, numbering old and new lines from each `@@ -a,b +c,d @@` header
 * (GNU diffutils manual, "Detailed Description of Unified Format").
 * @param unified - the diff text.
 * @returns the lines.
 */
export function parseUnifiedDiff(unified: string): DiffLine[] {
  const lines: DiffLine[] = [];
  let oldLine = 0;
  let newLine = 0;
  let inHunk = false;
  const rows = unified.split('\n');
  if (rows.length > 0 && rows[rows.length - 1] === '') rows.pop();
  for (const text of rows) {
    const hunk = /^@@ -(\d+)(?:,\d+)? \+(\d+)(?:,\d+)? @@/.exec(text);
    if (hunk) {
      oldLine = Number(hunk[1]);
      newLine = Number(hunk[2]);
      inHunk = true;
      lines.push({ kind: 'hunk', text, oldLine: null, newLine: null });
    } else if (!inHunk && (text.startsWith('--- ') || text.startsWith('+++ ') || text.startsWith('=') || text.startsWith('Index:'))) {
      lines.push({ kind: 'file', text, oldLine: null, newLine: null });
    } else if (text.startsWith('\\')) {
      lines.push({ kind: 'note', text, oldLine: null, newLine: null });
    } else if (inHunk && text.startsWith('+')) {
      lines.push({ kind: 'added', text, oldLine: null, newLine: newLine++ });
    } else if (inHunk && text.startsWith('-')) {
      lines.push({ kind: 'removed', text, oldLine: oldLine++, newLine: null });
    } else if (inHunk) {
      lines.push({ kind: 'context', text, oldLine: oldLine++, newLine: newLine++ });
    } else {
      lines.push({ kind: 'file', text, oldLine: null, newLine: null });
    }
  }
  return lines;
}
