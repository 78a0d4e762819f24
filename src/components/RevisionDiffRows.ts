// Rows of a revision in the form's words and units, and the comparison of two revisions built
// from them: a value counts as changed when its displayed text changes; a change below display
// precision is kept apart (folded away, exact values on hover). The unified header diff is split
// into typed lines with old/new line numbers.
import type { AnalysisResult, BlockId, DesignInput, Severity } from '../../shared/control';
import { FIELD_GROUPS, RESONANT_GAIN_UNIT } from '../composables/designFields';
import { formatExact, formatInDisplayUnit, formatNumber, formatQuantity } from '../composables/format';
import { BLOCK_LABELS, gainLabel, LOOP_LABELS, LOOP_METRICS, methodLabel, sectionLabel } from '../composables/labels';

/** One shown value of a revision. */
export interface DisplayRow {
  /** Stable identity for pairing two revisions (a key path, a check id). */
  key: string;
  /** Heading the row sits under (a form group, a block, a loop). */
  group: string;
  label: string;
  /** What the page shows. */
  text: string;
  /** Every digit, for the hover title. */
  exact: string;
  /** For checks: the severity. */
  severity?: Severity;
}

/** A titled group of rows. */
export interface DisplayGroup {
  title: string;
  rows: DisplayRow[];
}

/** How a value moved between two revisions. */
export type CompareStatus = 'same' | 'changed' | 'below-precision' | 'added' | 'removed';

/** One compared value. */
export interface CompareRow {
  key: string;
  group: string;
  label: string;
  before: DisplayRow | null;
  after: DisplayRow | null;
  status: CompareStatus;
}

const DESIGNED_BY_RULE = 'designed by rule';

function getPath(object: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((node, key) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined), object);
}

/**
 * The inputs of a design as the form shows them: its groups, labels and display units
 * (`dcLink.capacitanceF` 0.00068 reads "DC-link capacitance 680 µF").
 * @param design - a design file.
 * @returns the groups with their rows, in form order.
 */
export function designInputGroups(design: DesignInput): DisplayGroup[] {
  const groups: DisplayGroup[] = [];
  for (const group of FIELD_GROUPS) {
    const rows: DisplayRow[] = [];
    const add = (key: string, label: string, text: string, exact: string) => rows.push({ key, group: group.title, label, text, exact });
    if (group.id === 'filter') add('filter.topology', 'Topology', `${design.filter.topology} filter`, design.filter.topology);
    for (const field of group.fields) {
      if (field.topology && field.topology !== design.filter.topology) continue;
      const raw = getPath(design, field.path);
      if (typeof raw === 'number') add(field.path, field.label, formatInDisplayUnit(raw, field.unit), formatExact(raw, field.unit.symbol ? unitOfDimension(field.dimension) : null));
      else add(field.path, field.label, field.optional ? DESIGNED_BY_RULE : '—', field.optional ? DESIGNED_BY_RULE : 'absent');
    }
    if (group.id === 'current-loop') {
      add('currentLoop.harmonics', 'Resonant harmonics', design.currentLoop.harmonics.join(', '), JSON.stringify(design.currentLoop.harmonics));
      const gains = design.currentLoop.resonantGains;
      design.currentLoop.harmonics.forEach((h, i) => {
        const g = gains?.[i];
        add(`currentLoop.resonantGains.h${h}`, `kr, h${h}`, typeof g === 'number' ? formatInDisplayUnit(g, RESONANT_GAIN_UNIT) : DESIGNED_BY_RULE, typeof g === 'number' ? String(g) : DESIGNED_BY_RULE);
      });
    }
    if (group.id === 'reactive') add('reactiveFilter.order', 'Low-pass order', design.reactiveFilter.order === 2 ? '2nd order (Butterworth)' : '1st order', String(design.reactiveFilter.order));
    groups.push({ title: group.title, rows });
  }
  groups.push({ title: 'Target word size', rows: [{ key: 'fixedPoint.wordBits', group: 'Target word size', label: 'Word size', text: `${design.fixedPoint.wordBits}-bit`, exact: String(design.fixedPoint.wordBits) }] });
  return groups;
}

function unitOfDimension(dimension: string): string | null {
  return dimension === 'Ohm' ? 'Ω' : dimension === 'count' || dimension === 'gain' || dimension === 'ratio' ? null : dimension;
}

/**
 * The gains in use per block, named and in their units.
 * @param analysis - an analysis result.
 * @param design - its design (harmonic orders of the resonant gains).
 * @returns the rows, grouped by block.
 */
export function gainRows(analysis: AnalysisResult, design: DesignInput): DisplayRow[] {
  const rows: DisplayRow[] = [];
  for (const block of analysis.blocks) {
    for (const [key, value] of Object.entries(block.gains)) {
      if (Array.isArray(value)) {
        value.forEach((v, i) => {
          const h = design.currentLoop.harmonics[i] ?? i + 1;
          const { label, unit } = gainLabel(block.id, key, h);
          rows.push({ key: `${block.id}.${key}.h${h}`, group: BLOCK_LABELS[block.id], label, text: withUnit(formatNumber(v, 5), unit), exact: formatExact(v) });
        });
      } else {
        const { label, unit } = gainLabel(block.id, key);
        const text = unit === 'Hz' ? formatQuantity(value, 'Hz', 5) : withUnit(formatNumber(value, 5), unit);
        rows.push({ key: `${block.id}.${key}`, group: BLOCK_LABELS[block.id], label, text, exact: formatExact(value) });
      }
    }
  }
  return rows;
}

function withUnit(text: string, unit: string | null): string {
  return unit ? `${text} ${unit}` : text;
}

/**
 * Section coefficients: the doubles to seven significant digits, or the quantized integers
 * (exact) with their Q format; each section also names its discretization method.
 * @param analysis - an analysis result.
 * @param kind - `float` or `fixed`.
 * @returns one row per section and coefficient vector.
 */
export function coefficientRows(analysis: AnalysisResult, kind: 'float' | 'fixed'): DisplayRow[] {
  const rows: DisplayRow[] = [];
  for (const block of analysis.blocks) {
    for (const section of block.sections) {
      const group = sectionLabel(block.id, section.role, block.sections.length);
      const key = `${block.id}/${section.role}`;
      const vector = (label: string, values: readonly number[]) => ({
        text: `[${values.map((v) => (kind === 'fixed' ? String(v) : formatNumber(v, 7))).join(', ')}]`,
        exact: `[${values.map(String).join(', ')}]`,
        label,
      });
      if (kind === 'float') {
        rows.push({ key: `${key}.method`, group, label: 'method', text: methodLabel(block.method), exact: methodLabel(block.method) });
        for (const [name, values] of [['b', section.b], ['a', section.a]] as const) rows.push({ key: `${key}.${name}`, group, ...vector(name, values) });
      } else {
        rows.push({ key: `${key}.format`, group, label: 'format', text: section.fixed.qFormat, exact: `${section.fixed.qFormat} (${section.fixed.wordBits}-bit, F = ${section.fixed.fracBits})` });
        for (const [name, values] of [['b', section.fixed.b], ['a', section.fixed.a]] as const) rows.push({ key: `${key}.fixed.${name}`, group, ...vector(`${name} (integers)`, values) });
      }
    }
  }
  return rows;
}

/**
 * Loop margins, named and in their units.
 * @param analysis - an analysis result.
 * @returns one row per loop and figure.
 */
export function marginRows(analysis: AnalysisResult): DisplayRow[] {
  return analysis.loops.flatMap((loop) => [
    ...LOOP_METRICS.map((m) => ({
      key: `${loop.id}.${m.key}`, group: LOOP_LABELS[loop.id], label: m.label,
      text: loop[m.key] === null ? 'none' : formatQuantity(loop[m.key], m.unit, m.digits), exact: formatExact(loop[m.key], m.unit),
    })),
    { key: `${loop.id}.stable`, group: LOOP_LABELS[loop.id], label: 'verdict', text: loop.stable ? 'stable' : 'UNSTABLE', exact: String(loop.stable) },
  ]);
}

/**
 * Checks as their messages with severity; the check id pairs the two revisions.
 * @param analysis - an analysis result.
 * @returns one row per check, errors first.
 */
export function checkRows(analysis: AnalysisResult): DisplayRow[] {
  const rank: Record<Severity, number> = { error: 0, warning: 1, info: 2 };
  const groups: Record<Severity, string> = { error: 'Errors', warning: 'Warnings', info: 'Notes (within their limits)' };
  return [...analysis.checks].sort((a, b) => rank[a.severity] - rank[b.severity]).map((c) => ({
    key: c.id, group: groups[c.severity], label: c.blockId ? BLOCK_LABELS[c.blockId as BlockId] : 'Plant and loops',
    text: c.message, exact: [c.message, c.remedy ? `Remedy: ${c.remedy}` : ''].filter(Boolean).join(' '), severity: c.severity,
  }));
}

/**
 * Pairs the rows of two revisions by key, in the order of the newer one, with rows only the older
 * has placed where they stood in it. Equal text means equal to the reader: a difference only in
 * the exact value is `below-precision`.
 * @param before - rows of the older revision.
 * @param after - rows of the newer revision.
 * @returns the compared rows.
 */
export function compareRows(before: readonly DisplayRow[], after: readonly DisplayRow[]): CompareRow[] {
  const older = new Map(before.map((r) => [r.key, r]));
  const newer = new Map(after.map((r) => [r.key, r]));
  const olderIndex = new Map(before.map((r, i) => [r.key, i]));
  const keys: string[] = [];
  let nextOlder = 0;
  const flushOlderOnly = (upTo: number) => {
    for (; nextOlder < upTo; nextOlder += 1) if (!newer.has(before[nextOlder].key)) keys.push(before[nextOlder].key);
  };
  for (const row of after) {
    const at = olderIndex.get(row.key);
    if (at !== undefined && at >= nextOlder) {
      flushOlderOnly(at);
      nextOlder = at + 1;
    }
    keys.push(row.key);
  }
  flushOlderOnly(before.length);
  return keys.map((key) => {
    const b = older.get(key) ?? null;
    const a = newer.get(key) ?? null;
    const shown = (a ?? b) as DisplayRow;
    let status: CompareStatus;
    if (!b) status = 'added';
    else if (!a) status = 'removed';
    else if (a.text !== b.text || a.severity !== b.severity) status = 'changed';
    else status = a.exact === b.exact ? 'same' : 'below-precision';
    return { key, group: shown.group, label: shown.label, before: b, after: a, status };
  });
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
