// Structured differences between two revisions: inputs, gains, coefficients, formats, margins, checks.
import type { DiffChange } from '../../shared/api/revisions';
import type { AnalysisResult, DesignInput } from '../../shared/control';

type Flat = Map<string, unknown>;

/**
 * Flattens JSON into `path → leaf` (array items by index, `harmonics.2`, as the design schema names them).
 * @param value - any JSON value.
 * @param prefix - path so far.
 * @param out - accumulator.
 * @returns the accumulator.
 */
export function flatten(value: unknown, prefix = '', out: Flat = new Map()): Flat {
  if (Array.isArray(value)) {
    if (value.length === 0) out.set(prefix, []);
    value.forEach((v, i) => flatten(v, prefix === "" ? String(i) : `${prefix}.${i}`, out));
  } else if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>);
    if (entries.length === 0) out.set(prefix, {});
    for (const [k, v] of entries) flatten(v, prefix === '' ? k : `${prefix}.${k}`, out);
  } else out.set(prefix, value === undefined ? null : value);
  return out;
}

/**
 * Leaves that differ (exact comparison: a coefficient that moved by one ulp is a change).
 * @param before - flattened before.
 * @param after - flattened after.
 * @returns changes in path order.
 */
export function changedLeaves(before: Flat, after: Flat): DiffChange[] {
  const keys = [...new Set([...before.keys(), ...after.keys()])].sort();
  const out: DiffChange[] = [];
  for (const k of keys) {
    const x = before.has(k) ? before.get(k) : null;
    const y = after.has(k) ? after.get(k) : null;
    if (JSON.stringify(x) !== JSON.stringify(y)) out.push({ path: k, before: x, after: y });
  }
  return out;
}

function pick(analysis: AnalysisResult, what: 'gains' | 'coefficients' | 'fixed' | 'formats'): Flat {
  const out: Flat = new Map();
  for (const block of analysis.blocks) {
    if (what === 'gains') flatten(block.gains, block.id, out);
    for (const s of what === 'gains' ? [] : block.sections) {
      const at = `${block.id}.${s.role}`;
      if (what === 'coefficients') { flatten(s.b, `${at}.b`, out); flatten(s.a, `${at}.a`, out); }
      if (what === 'fixed' && s.fixed) { flatten(s.fixed.b, `${at}.fixed.b`, out); flatten(s.fixed.a, `${at}.fixed.a`, out); }
      if (what === 'formats' && s.fixed) { out.set(`${at}.wordBits`, s.fixed.wordBits); out.set(`${at}.fracBits`, s.fixed.fracBits); }
    }
  }
  return out;
}

function margins(analysis: AnalysisResult): Flat {
  const out: Flat = new Map();
  for (const loop of analysis.loops) {
    for (const key of ['crossoverHz', 'phaseMarginDeg', 'gainMarginDb', 'peakSensitivity', 'maxPoleRadius', 'stable'] as const) {
      out.set(`${loop.id}.${key}`, (loop as unknown as Record<string, unknown>)[key] ?? null);
    }
  }
  return out;
}

function checks(analysis: AnalysisResult): Map<string, unknown> {
  return new Map(analysis.checks.map((c) => [c.id, c]));
}

/**
 * Compares the inputs and results of two revisions.
 * @param a - before: design and analysis.
 * @param b - after.
 * @param a.design - design before.
 * @param a.analysis - analysis before.
 * @param b.design - design after.
 * @param b.analysis - analysis after.
 * @returns the structured changes.
 */
export function compareRevisions(a: { design: DesignInput; analysis: AnalysisResult }, b: { design: DesignInput; analysis: AnalysisResult }) {
  const ca = checks(a.analysis);
  const cb = checks(b.analysis);
  return {
    inputs: changedLeaves(flatten(a.design), flatten(b.design)),
    gains: changedLeaves(pick(a.analysis, 'gains'), pick(b.analysis, 'gains')),
    coefficients: changedLeaves(pick(a.analysis, 'coefficients'), pick(b.analysis, 'coefficients')),
    fixedCoefficients: changedLeaves(pick(a.analysis, 'fixed'), pick(b.analysis, 'fixed')),
    formats: changedLeaves(pick(a.analysis, 'formats'), pick(b.analysis, 'formats')),
    margins: changedLeaves(margins(a.analysis), margins(b.analysis)),
    checks: {
      added: [...cb.keys()].filter((k) => !ca.has(k)).map((k) => ({ path: k, before: null, after: cb.get(k) })),
      removed: [...ca.keys()].filter((k) => !cb.has(k)).map((k) => ({ path: k, before: ca.get(k), after: null })),
      changed: [...ca.keys()].filter((k) => cb.has(k) && JSON.stringify(ca.get(k)) !== JSON.stringify(cb.get(k))).map((k) => ({ path: k, before: ca.get(k), after: cb.get(k) })),
    },
  };
}
