import { FIXED_ARITHMETIC, safeInputMagnitude, signalMax, type AnalysisResult, type BlockResult, type DesignInput, type GoldenVector, type SectionResult } from '../../shared/control/index';
import { canonicalJson, sha256Hex } from './canonical';
import { blockToken, cNames, roleToken, type CNames } from './cIdentifiers';
import { designSlug } from './slug';

/** Text of the safety caution (DESIGN.md "Safety"), printed in the header, the source, the report and the manifest. */
export const SAFETY_CAUTION = [
  'SAFETY CAUTION: these coefficients drive hardware connected to the mains with a DC link at',
  'hundreds of volts. An unstable loop means over-current, device failure and fire. Verify every',
  'set on a current-limited bench or hardware-in-the-loop rig before energizing; grid connection',
  'must follow the local interconnection and safety codes (for example IEEE 1547, IEC 61727,',
  'IEC 62109-1) and be done by qualified people.',
];

/** Factor of the single-phase reactive-power estimate q = 2 * LPF(v_q * i) (the product of two sines has half the amplitude product as mean). */
export const REACTIVE_ESTIMATE_FACTOR = 2;

/** Samples per golden vector and the noise seed of every export (documented constants: same inputs, same vectors). */
export const VECTOR_SAMPLES = 1000;
/** Seed of the xorshift32 noise excitation of the golden vectors. */
export const VECTOR_SEED = 0x5eed2f6b;

/** Metadata printed with the generated files. */
export interface ExportMeta {
  version: string;
  revision: number | null;
  draft: boolean;
  toolVersion: string;
  createdAt: Date;
}

/** One printed coefficient: C macro name, integer literal, the double it came from, and the report columns. */
export interface CoefficientView {
  name: string;
  macro: string;
  integer: string;
  /** The integer as plain decimal text (report). */
  code: string;
  realMacro: string;
  real: string;
  quantized: string;
  error: string;
}

/** One section as the templates print it. */
export interface SectionView {
  role: string;
  kind: string;
  qFormat: string;
  fracBits: number;
  shiftMacro: string;
  inputLimitMacro: string;
  inputLimit: string;
  inputLimitLsb: string;
  prewarp: string;
  coefficients: CoefficientView[];
  bMacros: string[];
  aMacros: string[];
  resonance: string | null;
  drift: string | null;
  headroom: string | null;
  deadband: string | null;
  lost: string | null;
  isLast: boolean;
}

/** One block as the templates print it. */
export interface BlockView {
  id: string;
  token: string;
  method: string;
  sectionsMacro: string;
  sectionCount: number;
  tableName: string;
  gains: { name: string; value: string; source: string }[];
  sections: SectionView[];
}

/** Everything the templates print; templates hold no arithmetic. */
export interface BundleView {
  c: CNames;
  slug: string;
  guard: string;
  apiGuard: string;
  vectorsGuard: string;
  headerFile: string;
  apiHeaderFile: string;
  sourceFile: string;
  vectorsFile: string;
  vectorsHeaderFile: string;
  designName: string;
  designNameComment: string;
  designNameC: string;
  version: string;
  revision: string;
  toolVersion: string;
  createdAt: string;
  draft: boolean;
  draftLine: string;
  inputsSha256: string;
  safety: string[];
  wordBits: number;
  signalMax: string;
  sampleTimeS: string;
  arithmetic: string[];
  scaling: { macro: string; value: string; unit: string; meaning: string }[];
  blocks: BlockView[];
  inputs: { path: string; value: string }[];
  loops: { id: string; crossover: string; phaseMargin: string; gainMargin: string; peakSensitivity: string; maxPoleRadius: string; stable: string; notes: string }[];
  checks: { severity: string; id: string; message: string; value: string; limit: string; remedy: string }[];
  cautions: string[];
  checkCounts: string;
  vectors: VectorView[];
  vectorCount: number;
  vectorSamples: number;
  maxSections: number;
}

/** One golden vector as the tables print it. */
export interface VectorView {
  label: string;
  description: string;
  inName: string;
  outName: string;
  length: number;
  tableName: string;
  sectionsMacro: string;
  groupIndex: number;
  /** Initializer lines of the input and expected tables, indented, one string each. */
  inText: string;
  outText: string;
}

/**
 * C double literal with the shortest text that reads back to the same binary64.
 *
 * @param value - finite double.
 * @returns e.g. `2.5e-05`, `1.0`, `-0.5`.
 */
export function cDouble(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`cDouble: non-finite value ${value}`);
  const text = Object.is(value, -0) ? '-0.0' : String(value);
  return /[.e]/.test(text) ? text : `${text}.0`;
}

/**
 * C integer literal of a W-bit code (W <= 32), parenthesised when negative so macros expand safely.
 *
 * @param value - integer within +-(2^31 - 1).
 * @returns e.g. `INT32_C(1073741824)` or `(-INT32_C(5))`.
 */
export function cInt32(value: number): string {
  if (!Number.isInteger(value) || Math.abs(value) > 2 ** 31 - 1) throw new RangeError(`cInt32: ${value} is not a 32-bit code`);
  return value < 0 ? `(-INT32_C(${-value}))` : `INT32_C(${value})`;
}

function fmt(value: number | null | undefined, digits = 6): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return Number(value.toPrecision(digits)).toString();
}

/** Comment-safe text: no comment terminators or line breaks. */
function commentSafe(text: string): string {
  return text.replace(/[\r\n\t]+/g, ' ').replace(/\*\//g, '* /').replace(/\/\*/g, '/ *');
}

/** C string literal body: printable ASCII, backslash and quote escaped, everything else as '?'. */
function cStringBody(text: string): string {
  return text.replace(/[^\x20-\x7e]/g, '?').replace(/\\/g, '\\\\').replace(/"/g, '\\"').replace(/\?\?/g, '?\\?');
}

/** Markdown table cell: pipes escaped, one line. */
function cell(text: string): string {
  return text.replace(/[\r\n]+/g, ' ').replace(/\|/g, '\\|');
}

function flatten(value: unknown, path: string, out: { path: string; value: string }[]): void {
  if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    for (const [k, v] of Object.entries(value as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : 1))) flatten(v, path === '' ? k : `${path}.${k}`, out);
    return;
  }
  out.push({ path, value: cell(JSON.stringify(value)) });
}

function presentSection(c: CNames, block: BlockResult, section: SectionResult, index: number, count: number): SectionView {
  const token = roleToken(section.role);
  // two sections of one block with the same role (e.g. a repeated harmonic) get their index appended
  const repeated = block.sections.some((s, i) => i !== index && roleToken(s.role) === token);
  const base = `${c.macro}_${blockToken(block.id).toUpperCase()}_${token}${repeated ? `_${index}` : ''}`;
  const f = section.fixed;
  const scale = 2 ** -f.fracBits;
  const entries: [string, number, number][] = [
    ['B0', section.b[0], f.b[0]], ['B1', section.b[1], f.b[1]], ['B2', section.b[2], f.b[2]],
    ['A0', section.a[0], f.a[0]], ['A1', section.a[1], f.a[1]], ['A2', section.a[2], f.a[2]],
  ];
  const coefficients = entries.map(([name, real, code]) => ({
    name,
    macro: `${base}_${name}`,
    integer: cInt32(code),
    code: String(code),
    realMacro: `${base}_${name}_REAL`,
    real: cDouble(real),
    quantized: fmt(code * scale, 12),
    error: fmt(code * scale - real, 3),
  }));
  const r = section.resonanceHz;
  const fa = section.fixedAnalysis;
  return {
    role: section.role,
    kind: section.kind,
    qFormat: f.qFormat,
    fracBits: f.fracBits,
    shiftMacro: `${base}_SHIFT`,
    inputLimitMacro: `${base}_INPUT_LIMIT`,
    inputLimit: cInt32(safeInputMagnitude(f)),
    inputLimitLsb: String(safeInputMagnitude(f)),
    prewarp: section.prewarpHz === null ? 'none' : `${fmt(section.prewarpHz)} Hz`,
    coefficients,
    bMacros: coefficients.slice(0, 3).map((x) => x.macro),
    aMacros: coefficients.slice(3).map((x) => x.macro),
    resonance: r ? `design ${fmt(r.design)} Hz, double ${fmt(r.discrete, 9)} Hz, fixed ${fmt(r.fixed, 9)} Hz` : null,
    drift: r && r.fixed !== null && r.discrete !== null ? `${fmt(r.fixed - r.discrete, 3)} Hz` : r ? 'undefined (no resonance after quantization)' : null,
    headroom: fa ? (fa.headroomBits === null ? 'unbounded' : `${fa.headroomBits} bits`) : null,
    deadband: fa ? (fa.deadbandLsb === null ? 'none' : `${fmt(fa.deadbandLsb, 4)} LSB`) : null,
    lost: fa && fa.lostCoefficients.length > 0 ? fa.lostCoefficients.join(', ') : null,
    isLast: index === count - 1,
  };
}

function rows(values: readonly number[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < values.length; i += 8) {
    const chunk = values.slice(i, i + 8).map((v) => (v < 0 ? `-${-v}` : String(v)));
    out.push(chunk.join(', ') + (i + 8 < values.length ? ',' : ''));
  }
  return out;
}

/**
 * Prepares every value the templates print (names, literals, report cells, vector rows).
 *
 * @param design - validated design.
 * @param analysis - its analysis.
 * @param meta - version, revision, draft flag, tool version, creation time.
 * @param vectors - golden vectors (may be empty when only the header is rendered).
 * @returns the view model.
 */
export function presentBundle(design: DesignInput, analysis: AnalysisResult, meta: ExportMeta, vectors: readonly GoldenVector[]): BundleView {
  const slug = designSlug(design.name);
  const c = cNames(slug);
  const wordBits = design.fixedPoint.wordBits;
  const voltageBaseV = Math.SQRT2 * design.grid.voltageRmsV;
  const currentBaseA = (Math.SQRT2 * design.rating.apparentPowerVA) / design.grid.voltageRmsV;
  const blocks = analysis.blocks.filter((b) => b.sections.length > 0);
  const reactiveGain = analysis.blocks.find((b) => b.id === 'reactive-lpf')?.gains.reactiveEstimateFactor;
  const reactiveFactor = typeof reactiveGain === 'number' ? reactiveGain : REACTIVE_ESTIMATE_FACTOR;
  const blockIndex = new Map(blocks.map((b, i) => [b.id, i]));
  const checks = [...analysis.checks].sort((p, q) => ['error', 'warning', 'info'].indexOf(p.severity) - ['error', 'warning', 'info'].indexOf(q.severity) || (p.id < q.id ? -1 : p.id > q.id ? 1 : 0));
  const count = (s: string): number => analysis.checks.filter((x) => x.severity === s).length;
  const inputs: { path: string; value: string }[] = [];
  flatten(design, '', inputs);
  return {
    c,
    slug,
    guard: `${c.macro}_COEFS_H`,
    apiGuard: `${c.macro}_FILTER_H`,
    vectorsGuard: `${c.macro}_VECTORS_H`,
    headerFile: `${slug}_coefs.h`,
    apiHeaderFile: `${slug}_filter.h`,
    sourceFile: `${slug}_filter.c`,
    vectorsFile: `${slug}_vectors.c`,
    vectorsHeaderFile: `${slug}_vectors.h`,
    designName: cell(design.name),
    designNameComment: commentSafe(design.name),
    designNameC: cStringBody(design.name),
    version: meta.version,
    revision: meta.revision === null ? 'none (working copy)' : String(meta.revision),
    toolVersion: meta.toolVersion,
    createdAt: meta.createdAt.toISOString(),
    draft: meta.draft,
    draftLine: 'DRAFT: not a released set; not reviewed; do not load onto hardware.',
    inputsSha256: sha256Hex(canonicalJson(design)),
    safety: SAFETY_CAUTION,
    wordBits,
    signalMax: cInt32(signalMax(wordBits)),
    sampleTimeS: cDouble(analysis.sampleTimeS),
    arithmetic: [
      `structure: ${FIXED_ARITHMETIC.structure}, ${FIXED_ARITHMETIC.accumulatorBits}-bit accumulator`,
      `saturation: ${FIXED_ARITHMETIC.saturation}, [${FIXED_ARITHMETIC.saturationMinFormula}, ${FIXED_ARITHMETIC.saturationMaxFormula}]`,
      `rounding constant: ${FIXED_ARITHMETIC.roundingConstantFormula}`,
      `shift: ${FIXED_ARITHMETIC.shift}, rounding ${FIXED_ARITHMETIC.rounding}`,
      `accumulator: ${FIXED_ARITHMETIC.accumulatorOverflow}`,
      `block output: ${FIXED_ARITHMETIC.blockSum}`,
      `reset: ${FIXED_ARITHMETIC.resetState}`,
      `coefficients: ${FIXED_ARITHMETIC.coefficientRounding}`,
    ],
    scaling: [
      { macro: `${c.macro}_SCALE_SAMPLE_TIME_S`, value: cDouble(analysis.sampleTimeS), unit: 's', meaning: 'sampling period Ts' },
      { macro: `${c.macro}_SCALE_GRID_FREQUENCY_HZ`, value: cDouble(design.grid.frequencyHz), unit: 'Hz', meaning: 'nominal grid frequency' },
      { macro: `${c.macro}_SCALE_VOLTAGE_BASE_V`, value: cDouble(voltageBaseV), unit: 'V', meaning: 'per-unit voltage base: grid voltage amplitude sqrt(2) * Vrms' },
      { macro: `${c.macro}_SCALE_CURRENT_BASE_A`, value: cDouble(currentBaseA), unit: 'A', meaning: 'per-unit current base: rated current amplitude sqrt(2) * S / Vrms' },
      { macro: `${c.macro}_SCALE_IMPEDANCE_BASE_OHM`, value: cDouble(voltageBaseV / currentBaseA), unit: 'ohm', meaning: 'per-unit impedance base: voltage base / current base' },
      { macro: `${c.macro}_SCALE_DC_VOLTAGE_BASE_V`, value: cDouble(design.dcLink.voltageRefV), unit: 'V', meaning: 'DC-link voltage reference (base of the DC-link per-unit)' },
      { macro: `${c.macro}_SCALE_REACTIVE_FACTOR`, value: cDouble(reactiveFactor), unit: '1', meaning: 'reactive estimate q = factor * low-pass(v_q * i)' },
      { macro: `${c.macro}_SCALE_FEEDFORWARD`, value: cDouble(voltageBaseV / design.dcLink.voltageRefV), unit: '1', meaning: 'grid-voltage feed-forward: per-unit grid voltage to modulation index (voltage base / DC-link reference)' },
    ],
    blocks: blocks.map((block) => ({
      id: block.id,
      token: blockToken(block.id),
      method: block.method,
      sectionsMacro: `${c.macro}_${blockToken(block.id).toUpperCase()}_SECTIONS`,
      sectionCount: block.sections.length,
      tableName: `${c.prefix}_${blockToken(block.id)}_taps`,
      gains: Object.keys(block.gains).sort().map((name) => {
        const g = block.gains[name];
        return { name, value: Array.isArray(g) ? g.map((v) => fmt(v, 8)).join(', ') : fmt(g, 8), source: block.gainSource?.[name] ?? '—' };
      }),
      sections: block.sections.map((s, i) => presentSection(c, block, s, i, block.sections.length)),
    })),
    inputs,
    loops: analysis.loops.map((l) => ({
      id: l.id,
      crossover: l.crossoverHz === null ? '—' : `${fmt(l.crossoverHz, 5)} Hz`,
      phaseMargin: l.phaseMarginDeg === null ? '—' : `${fmt(l.phaseMarginDeg, 4)}°`,
      gainMargin: l.gainMarginDb === null ? '—' : `${fmt(l.gainMarginDb, 4)} dB`,
      peakSensitivity: fmt(l.peakSensitivity, 4),
      maxPoleRadius: fmt(l.maxPoleRadius, 6),
      stable: l.stable ? 'yes' : 'NO',
      notes: cell((l.notes ?? []).join(' ')),
    })),
    checks: checks.map((x) => ({
      severity: x.severity,
      id: x.id,
      message: cell(x.message),
      value: x.value === null ? '—' : `${fmt(x.value)}${x.unit ? ` ${x.unit}` : ''}`,
      limit: x.limit === null ? '—' : `${fmt(x.limit)}${x.unit ? ` ${x.unit}` : ''}`,
      remedy: cell(x.remedy ?? ''),
    })),
    cautions: checks.filter((x) => x.severity !== 'info').map((x) => cell(`${x.severity.toUpperCase()} ${x.id}: ${x.message}${x.remedy ? ` Remedy: ${x.remedy}` : ''}`)),
    checkCounts: `${count('error')} error, ${count('warning')} warning, ${count('info')} info`,
    vectors: vectors.map((v, k) => ({
      label: `${v.blockId}/${v.name}`,
      description: commentSafe(v.description),
      inName: `${c.prefix}_vec${k}_in`,
      outName: `${c.prefix}_vec${k}_out`,
      length: v.input.length,
      tableName: `${c.prefix}_${blockToken(v.blockId)}_taps`,
      sectionsMacro: `${c.macro}_${blockToken(v.blockId).toUpperCase()}_SECTIONS`,
      groupIndex: blockIndex.get(v.blockId) ?? -1,
      inText: rows(v.input).map((r) => `  ${r}`).join('\n'),
      outText: rows(v.expected).map((r) => `  ${r}`).join('\n'),
    })),
    vectorCount: vectors.length,
    vectorSamples: vectors.length === 0 ? 0 : vectors[0].input.length,
    maxSections: Math.max(1, ...blocks.map((b) => b.sections.length)),
  };
}
