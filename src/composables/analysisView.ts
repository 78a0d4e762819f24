// Shapes an analysis result for the analysis tables: designed gains for the form's placeholders,
// where each resonance lands per method, and the fixed-point rows with what is wrong in each.
import type { AnalysisResult, BlockId, Check, SectionResult } from '../../shared/control';
import { formatNumber } from './format';
import { sectionLabel } from './labels';

const GAIN_PATHS: { block: BlockId; gain: string; path: string }[] = [
  { block: 'current-pr', gain: 'kp', path: 'currentLoop.kp' },
  { block: 'voltage-pi', gain: 'kp', path: 'voltageLoop.kp' },
  { block: 'voltage-pi', gain: 'ki', path: 'voltageLoop.ki' },
  { block: 'pll-pi', gain: 'kp', path: 'pll.kp' },
  { block: 'pll-pi', gain: 'ki', path: 'pll.ki' },
];

/**
 * The gains in use, as display texts keyed by the design-file path of their override.
 * @param result - an analysis result.
 * @returns texts such as `{ 'currentLoop.kp': '3.77' }` (four significant digits).
 */
export function designedGainTexts(result: AnalysisResult | null): Record<string, string> {
  const out: Record<string, string> = {};
  if (!result) return out;
  for (const { block, gain, path } of GAIN_PATHS) {
    const value = result.blocks.find((b) => b.id === block)?.gains[gain];
    if (typeof value === 'number') out[path] = formatNumber(value, 4);
  }
  const kr = result.blocks.find((b) => b.id === 'current-pr')?.gains.resonantGains;
  if (Array.isArray(kr)) kr.forEach((v, i) => { out[`currentLoop.resonantGains.${i}`] = formatNumber(v, 4); });
  return out;
}

/** One row of the resonance table. */
export interface ResonanceRow {
  key: string;
  /** Block and section in words. */
  label: string;
  blockId: BlockId;
  role: string;
  designHz: number;
  discreteHz: number | null;
  fixedHz: number | null;
  /** fixed - design, Hz. */
  fixedDriftHz: number | null;
  byMethodHz: Record<string, number | null>;
}

/**
 * Every section with a resonance, with where it lands under each method.
 * @param result - an analysis result.
 * @returns rows and the union of method names, in first-seen order.
 */
export function resonanceRows(result: AnalysisResult): { rows: ResonanceRow[]; methods: string[] } {
  const rows: ResonanceRow[] = [];
  const methods: string[] = [];
  for (const block of result.blocks) {
    for (const section of block.sections) {
      if (!section.resonanceHz) continue;
      const byMethodHz = section.resonanceByMethodHz ?? {};
      for (const m of Object.keys(byMethodHz)) if (!methods.includes(m)) methods.push(m);
      const { design, discrete, fixed } = section.resonanceHz;
      rows.push({ key: `${block.id}/${section.role}`, label: sectionLabel(block.id, section.role, block.sections.length), blockId: block.id, role: section.role, designHz: design, discreteHz: discrete, fixedHz: fixed, fixedDriftHz: fixed === null ? null : fixed - design, byMethodHz });
    }
  }
  return { rows, methods };
}

/** One row of the fixed-point table. */
export interface WordRow {
  key: string;
  /** Block and section in words. */
  label: string;
  blockId: BlockId;
  section: SectionResult;
  /** Worst severity among the checks that concern this section. */
  severity: 'error' | 'warning' | null;
  /** Messages of those checks. */
  findings: string[];
}

function sectionToken(role: string): string | null {
  const h = /^resonant-h(\d+)$/.exec(role);
  return h ? `h${h[1]}` : null;
}

/**
 * Checks that concern one section: same block and, for resonators, the harmonic in the check id.
 * @param checks - all checks.
 * @param blockId - the section's block.
 * @param role - the section's role.
 * @param sectionsInBlock - how many sections the block has.
 * @returns the matching checks.
 */
export function checksForSection(checks: readonly Check[], blockId: BlockId, role: string, sectionsInBlock: number): Check[] {
  const token = sectionToken(role);
  return checks.filter((c) => {
    if (c.blockId !== blockId) return false;
    if (sectionsInBlock === 1) return true;
    if (token) return new RegExp(`(^|-)${token}(-|$)`).test(c.id);
    return c.id.includes(role);
  });
}

/**
 * Fixed-point rows with their findings.
 * @param result - an analysis result.
 * @returns one row per section.
 */
export function wordRows(result: AnalysisResult): WordRow[] {
  return result.blocks.flatMap((block) => block.sections.map((section) => {
    const related = checksForSection(result.checks, block.id, section.role, block.sections.length).filter((c) => c.severity !== 'info');
    const severity = related.some((c) => c.severity === 'error') ? 'error' : related.length ? 'warning' : null;
    return { key: `${block.id}/${section.role}`, label: sectionLabel(block.id, section.role, block.sections.length), blockId: block.id, section, severity, findings: related.map((c) => c.message) };
  }));
}
