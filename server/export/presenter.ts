import {
  blockSignals, conversionConstants, FLOAT32_MAX, perUnitBases, quantizeOwnScale, qFormatLabel, resolveSignals, scaleByPowerOfTwo,
  type AnalysisResult, type BlockResult, type DesignInput, type ResolvedSignals, type SectionResult,
} from '../../shared/control/index';
import { FIXED_ARITHMETIC, firmwareSet, safeInputMagnitude, signalMax, type FirmwareSet, type GoldenVector, type PiTaps } from '../../shared/firmware/index';
import { canonicalJson, sha256Hex } from './canonical';
import { blockToken, designCNames, roleToken, type CNames, type DesignCNames } from './cIdentifiers';
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

/** One printed coefficient: C macro name, literal, the double it came from, and the report columns. */
export interface CoefficientView {
  name: string;
  macro: string;
  /** C literal of the value the set uses: `INT32_C(...)` (fixed) or a hexadecimal float (float32). */
  integer: string;
  /** The integer (or the binary32 value) as plain decimal text (report). */
  code: string;
  realMacro: string;
  real: string;
  quantized: string;
  error: string;
  /** Delta-operator sections: the macro and value of this coefficient's own fraction bits. */
  shiftMacro: string | null;
  shift: number | null;
  qFormat: string;
}

/** One section as the templates print it. */
export interface SectionView {
  role: string;
  kind: string;
  /** `direct-form-1` or `delta-operator`. */
  structure: string;
  delta: boolean;
  qFormat: string;
  fracBits: number;
  shiftMacro: string;
  guardMacro: string;
  guardBits: number;
  inputLimitMacro: string;
  inputLimit: string;
  inputLimitLsb: string;
  /** True when the section has the 64-bit accumulator input limit of Direct Form I (fixed only). */
  hasInputLimit: boolean;
  prewarp: string;
  coefficients: CoefficientView[];
  /** The C initializer of this section's entry in its block table. */
  tapsInit: string;
  resonance: string | null;
  drift: string | null;
  headroom: string | null;
  deadband: string | null;
  lost: string | null;
  float32: string | null;
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
  /** g of CONTRACT section 7 applied to the numerators. */
  scale: string;
  gains: { name: string; value: string; source: string }[];
  sections: SectionView[];
}

/** A constant printed as an integer in a stated Q format, as a double and (float32 sets) as a binary32 literal. */
export interface ConstantView {
  macro: string;
  integer: string;
  shiftMacro: string;
  shift: number;
  qFormat: string;
  realMacro: string;
  real: string;
  floatMacro: string;
  float: string;
  unit: string;
  meaning: string;
}

/** A limit as the firmware holds it. */
export interface LimitView {
  macro: string;
  /** In the signal word: `INT32_C(...)` or a binary32 literal. */
  word: string;
  realMacro: string;
  real: string;
  unit: string;
  meaning: string;
}

/** A limited PI of the set. */
export interface PiView {
  id: string;
  gainsName: string;
  stepName: string;
  limitMacro: string;
  kpMacro: string;
  kp: string;
  kiMacro: string;
  ki: string;
  kpShiftMacro: string;
  kpShift: number;
  kiShiftMacro: string;
  kiShift: number;
  guardMacro: string;
  guard: number;
  kpReal: string;
  kiReal: string;
  qFormats: string;
  /** The C initializer of `struct p_pi_taps`. */
  init: string;
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
  /** True for a float32 set. */
  float: boolean;
  /** C type of a signal word (`int32_t` or `float`) and of a state (`int64_t` or `float`). */
  wordType: string;
  stateType: string;
  arithmeticTitle: string;
  arithmetic: string[];
  signalFracBits: number;
  signalFormat: string;
  /** The signal table, one padded comment line each (first line the column heads). */
  signalTable: string[];
  /** Where the C prefix came from, one comment line. */
  prefixNote: string;
  scaling: { macro: string; value: string; unit: string; meaning: string }[];
  constants: ConstantView[];
  limits: LimitView[];
  pis: PiView[];
  prBlockTable: string;
  prSectionsMacro: string;
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
  /** Harness kind macro: block filter, limited PI or limited block. */
  kindMacro: string;
  tableName: string;
  sectionsMacro: string;
  piName: string;
  limit: string;
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

/**
 * Bit pattern of a binary32 value.
 *
 * @param value - a value exactly representable in binary32.
 * @returns the 32-bit pattern as an unsigned integer.
 */
export function float32Bits(value: number): number {
  const view = new DataView(new ArrayBuffer(4));
  view.setFloat32(0, value);
  return view.getUint32(0);
}

/**
 * C99 hexadecimal float literal of a binary32 value (exact: no decimal rounding between the
 * model and the compiler), parenthesised when negative, e.g. `0x1.921fb6p+1f`, `(-0x1p-3f)`.
 *
 * @param value - a finite value exactly representable in binary32.
 * @returns the literal.
 */
export function cFloat32(value: number): string {
  if (!Number.isFinite(value) || Math.fround(value) !== value) throw new RangeError(`cFloat32: ${value} is not a finite binary32 value`);
  const bits = float32Bits(value);
  const negative = bits >>> 31 === 1;
  const exponent = (bits >>> 23) & 0xff;
  const mantissa = bits & 0x7fffff;
  let text: string;
  if (exponent === 0 && mantissa === 0) text = '0x0p+0f';
  else {
    const digits = (mantissa << 1).toString(16).padStart(6, '0').replace(/0+$/, '');
    const fraction = digits === '' ? '' : `.${digits}`;
    const power = exponent === 0 ? -126 : exponent - 127;
    text = `0x${exponent === 0 ? 0 : 1}${fraction}p${power >= 0 ? '+' : ''}${power}f`;
  }
  return negative ? `(-${text})` : text;
}

function fmt(value: number | null | undefined, digits = 6): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return Number(value.toPrecision(digits)).toString();
}

/** Comment-safe text: no comment terminators or line breaks. */
function commentSafe(text: string): string {
  return text.replace(/[\r\n\t]+/g, ' ').replace(/\*\//g, '* /').replace(/\/\*/g, '/ *');
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

// The doubles a section's integers approximate: `scaled` (CONTRACT section 7; an analysis stored
// before scaling existed has only b and a, quantized unscaled).
function scaledOf(section: SectionResult): { b: number[]; a: number[] } {
  return section.scaled ? { b: section.scaled.b, a: section.scaled.a } : { b: section.b, a: section.a };
}

// The binary32 coefficients of a float32 section (rounded here when an older analysis lacks them).
function float32Of(section: SectionResult): { form: 'direct-form-1' | 'delta-operator'; k: number[] } {
  if (section.float32) return { form: section.float32.form, k: section.float32.coefficients };
  const { b, a } = scaledOf(section);
  return { form: 'direct-form-1', k: [b[0], b[1], b[2], a[1], a[2]].map((v) => Math.fround(v)) };
}

function presentSection(c: CNames, block: BlockResult, section: SectionResult, index: number, count: number, float: boolean): SectionView {
  const token = roleToken(section.role);
  // two sections of one block with the same role (e.g. a repeated harmonic) get their index appended
  const repeated = block.sections.some((s, i) => i !== index && roleToken(s.role) === token);
  const base = `${c.macro}_${blockToken(block.id).toUpperCase()}_${token}${repeated ? `_${index}` : ''}`;
  const f = section.fixed;
  const scaled = scaledOf(section);
  const r = section.resonanceHz;
  const fa = section.fixedAnalysis;
  const deltaFixed = !float && section.delta ? section.delta.fixed : null;
  const f32 = float ? float32Of(section) : null;
  const isDelta = deltaFixed !== null || f32?.form === 'delta-operator';
  let coefficients: CoefficientView[];
  let tapsInit: string;
  const guardMacro = `${base}_GUARD`;
  if (f32) {
    const names = f32.form === 'delta-operator' ? ['B0', 'D1', 'D2', 'C1', 'C2'] : ['B0', 'B1', 'B2', 'A1', 'A2'];
    const reals = f32.form === 'delta-operator' && section.delta ? section.delta.coefficients : [scaled.b[0], scaled.b[1], scaled.b[2], scaled.a[1], scaled.a[2]];
    coefficients = names.map((name, i) => ({
      name, macro: `${base}_${name}`, integer: cFloat32(f32.k[i]), code: String(f32.k[i]), realMacro: `${base}_${name}_REAL`, real: cDouble(reals[i]),
      quantized: fmt(f32.k[i], 12), error: fmt(f32.k[i] - reals[i], 3), shiftMacro: null, shift: null, qFormat: 'binary32',
    }));
    tapsInit = `{ ${c.macro}_FORM_${isDelta ? 'DELTA' : 'DIRECT_1'}, { ${coefficients.map((x) => x.macro).join(', ')} } }`;
  } else if (deltaFixed && section.delta) {
    const names = ['B0', 'D1', 'D2', 'C1', 'C2'];
    const reals = section.delta.coefficients;
    coefficients = names.map((name, i) => {
      const code = deltaFixed.codes[i];
      const value = scaleByPowerOfTwo(code, -deltaFixed.fracBits[i]);
      return {
        name, macro: `${base}_${name}`, integer: cInt32(code), code: String(code), realMacro: `${base}_${name}_REAL`, real: cDouble(reals[i]),
        quantized: fmt(value, 12), error: fmt(value - reals[i], 3), shiftMacro: `${base}_${name}_SHIFT`, shift: deltaFixed.fracBits[i], qFormat: deltaFixed.qFormats[i],
      };
    });
    tapsInit = `{ ${c.macro}_FORM_DELTA, { ${coefficients.map((x) => x.macro).join(', ')} }, { ${coefficients.map((x) => `${x.shiftMacro} - ${guardMacro}`).join(', ')} }, ${guardMacro} }`;
  } else {
    const scale = 2 ** -f.fracBits;
    const entries: [string, number, number][] = [
      ['B0', scaled.b[0], f.b[0]], ['B1', scaled.b[1], f.b[1]], ['B2', scaled.b[2], f.b[2]],
      ['A0', scaled.a[0], f.a[0]], ['A1', scaled.a[1], f.a[1]], ['A2', scaled.a[2], f.a[2]],
    ];
    coefficients = entries.map(([name, real, code]) => ({
      name, macro: `${base}_${name}`, integer: cInt32(code), code: String(code), realMacro: `${base}_${name}_REAL`, real: cDouble(real),
      quantized: fmt(code * scale, 12), error: fmt(code * scale - real, 3), shiftMacro: null, shift: null, qFormat: f.qFormat,
    }));
    const shift = `${base}_SHIFT`;
    const used = coefficients.filter((x) => x.name !== 'A0').map((x) => x.macro);
    tapsInit = `{ ${c.macro}_FORM_DIRECT_1, { ${used.join(', ')} }, { ${[shift, shift, shift, shift, shift].join(', ')} }, 0 }`;
  }
  const hasInputLimit = !float && deltaFixed === null;
  const limit = hasInputLimit ? safeInputMagnitude(f) : 0;
  const f32r = section.float32;
  return {
    role: section.role,
    kind: section.kind,
    structure: isDelta ? 'delta-operator' : 'direct-form-1',
    delta: isDelta,
    qFormat: f32 ? 'binary32' : deltaFixed ? deltaFixed.qFormats.join(', ') : f.qFormat,
    fracBits: f.fracBits,
    shiftMacro: `${base}_SHIFT`,
    guardMacro,
    guardBits: deltaFixed ? deltaFixed.guardBits : 0,
    inputLimitMacro: `${base}_INPUT_LIMIT`,
    inputLimit: hasInputLimit ? cInt32(limit) : '',
    inputLimitLsb: hasInputLimit ? String(limit) : 'the whole word',
    hasInputLimit,
    prewarp: section.prewarpHz === null ? 'none' : `${fmt(section.prewarpHz)} Hz`,
    coefficients,
    tapsInit,
    resonance: r ? `design ${fmt(r.design)} Hz, double ${fmt(r.discrete, 9)} Hz, ${f32 ? `binary32 ${fmt(r.float32 ?? null, 9)}` : `fixed ${fmt(r.fixed, 9)}`} Hz` : null,
    drift: r && f32 ? `${fmt((r.float32 ?? Number.NaN) - (r.discrete ?? Number.NaN), 3)} Hz` : r && r.fixed !== null && r.discrete !== null ? `${fmt(r.fixed - r.discrete, 3)} Hz` : r ? 'undefined (no resonance after quantization)' : null,
    headroom: fa && !f32 ? (fa.headroomBits === null ? 'unbounded' : `${fa.headroomBits} bits`) : null,
    deadband: fa && !f32 ? (fa.deadbandLsb === null ? 'none' : `${fmt(fa.deadbandLsb, 4)} LSB`) : null,
    lost: fa && !f32 && fa.lostCoefficients.length > 0 ? fa.lostCoefficients.join(', ') : null,
    float32: f32r ? `DC gain ${fmt(f32r.dcGain)}, largest pole radius ${fmt(f32r.maxPoleRadius, 9)}${f32r.stall ? `, fed ${f32r.stall.inputPu} pu it settles ${fmt(100 * f32r.stall.relativeError, 3)} % off` : ''}` : null,
    isLast: index === count - 1,
  };
}

function rows(values: readonly string[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < values.length; i += 8) out.push(values.slice(i, i + 8).join(', ') + (i + 8 < values.length ? ',' : ''));
  return out;
}

function intText(v: number): string {
  return v < 0 ? `-${-v}` : String(v);
}

// Pads the cells of a table to common widths (comment lines of the header).
function padTable(table: string[][]): string[] {
  const widths = table[0].map((_, j) => Math.max(...table.map((row) => row[j].length)));
  return table.map((row) => row.map((x, j) => (j === row.length - 1 ? x : x.padEnd(widths[j]))).join('  ').trimEnd());
}

// The signal table: block, input, output, unit, base, Q format (CONTRACT section 7).
function signalTable(design: DesignInput, r: ResolvedSignals): string[] {
  const rows: string[][] = [['block', 'input', 'output', 'unit (in -> out)', 'base (in -> out)', 'Q format']];
  for (const s of blockSignals(design)) {
    const base = (d: typeof s.input): string => (d.baseName === 'none' ? 'none' : `${d.baseName} = ${fmt(d.baseValue, 6)} ${d.siUnit}`);
    rows.push([s.blockId, s.input.quantity, s.output.quantity, `${s.input.unit} -> ${s.output.unit}`, `${base(s.input)} -> ${base(s.output)}`, r.signalFormat]);
  }
  return padTable(rows);
}

function constantView(c: CNames, name: string, value: number, wordBits: number, unit: string, meaning: string): ConstantView {
  const q = quantizeOwnScale(value, wordBits);
  return {
    macro: `${c.macro}_${name}`, integer: cInt32(q.code), shiftMacro: `${c.macro}_${name}_SHIFT`, shift: q.fracBits, qFormat: qFormatLabel(wordBits, q.fracBits),
    realMacro: `${c.macro}_${name}_REAL`, real: cDouble(value), floatMacro: `${c.macro}_${name}_F32`, float: cFloat32(Math.fround(value)), unit, meaning,
  };
}

function piView(c: CNames, id: 'voltage-pi' | 'pll-pi', taps: PiTaps, limitMacro: string): PiView {
  const token = blockToken(id);
  const macro = `${c.macro}_${token.toUpperCase()}`;
  const fixed = taps.arithmetic === 'fixed';
  const kpValue = fixed ? taps.kp * 2 ** -taps.kpFracBits : taps.kp;
  const kiValue = fixed ? taps.ki * 2 ** -taps.kiFracBits : taps.ki;
  const view = {
    id, gainsName: `${c.prefix}_${token}_gains`, stepName: `${c.prefix}_${token}_step`, limitMacro,
    kpMacro: `${macro}_KP`, kp: fixed ? cInt32(taps.kp) : cFloat32(taps.kp), kiMacro: `${macro}_KI`, ki: fixed ? cInt32(taps.ki) : cFloat32(taps.ki),
    kpShiftMacro: `${macro}_KP_SHIFT`, kpShift: fixed ? taps.kpFracBits : 0, kiShiftMacro: `${macro}_KI_SHIFT`, kiShift: fixed ? taps.kiFracBits : 0,
    guardMacro: `${macro}_GUARD`, guard: fixed ? taps.guardBits : 0, kpReal: cDouble(kpValue), kiReal: cDouble(kiValue),
    qFormats: fixed ? `kp ${taps.qFormats[0]}, ki Ts/2 ${taps.qFormats[1]}, integrator in 2^-${taps.guardBits} LSB` : 'binary32',
    init: '',
  };
  view.init = fixed ? `{ ${view.kpMacro}, ${view.kiMacro}, ${view.kpShiftMacro} - ${view.guardMacro}, ${view.kiShiftMacro} - ${view.guardMacro}, ${view.guardMacro} }` : `{ ${view.kpMacro}, ${view.kiMacro} }`;
  return view;
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
  const r = resolveSignals(design);
  const names: DesignCNames = designCNames(design.firmware?.symbolPrefix, slug);
  const c: CNames = { prefix: names.prefix, macro: names.macro };
  const float = r.arithmetic === 'float32';
  const set: FirmwareSet | null = safeSet(design, analysis);
  const wordBits = float ? 32 : design.fixedPoint.wordBits;
  const bases = perUnitBases(design);
  const k = conversionConstants(design);
  const blocks = analysis.blocks.filter((b) => b.sections.length > 0);
  const reactiveGain = analysis.blocks.find((b) => b.id === 'reactive-lpf')?.gains.reactiveEstimateFactor;
  const reactiveFactor = typeof reactiveGain === 'number' ? reactiveGain : REACTIVE_ESTIMATE_FACTOR;
  const blockIndex = new Map(blocks.map((b, i) => [b.id, i]));
  const checks = [...analysis.checks].sort((p, q) => ['error', 'warning', 'info'].indexOf(p.severity) - ['error', 'warning', 'info'].indexOf(q.severity) || (p.id < q.id ? -1 : p.id > q.id ? 1 : 0));
  const count = (x: string): number => analysis.checks.filter((y) => y.severity === x).length;
  const inputs: { path: string; value: string }[] = [];
  flatten(design, '', inputs);
  const perUnit = r.units === 'per-unit';
  const sig = (si: string): string => (perUnit ? 'pu' : si);
  const constants = [
    constantView(c, 'ADC_CURRENT_PER_CODE', k.currentPerCode, wordBits, `${sig('A')}/code`, 'current signal per signed ADC code (full scale / 2^(bits-1), over Ibase in per unit)'),
    constantView(c, 'ADC_GRID_VOLTAGE_PER_CODE', k.gridVoltagePerCode, wordBits, `${sig('V')}/code`, 'grid-voltage signal per signed ADC code (over Vbase in per unit)'),
    constantView(c, 'ADC_DC_VOLTAGE_PER_CODE', k.dcVoltagePerCode, wordBits, `${sig('V')}/code`, 'DC-link voltage signal per signed ADC code (over VdcBase in per unit)'),
    constantView(c, 'PWM_COUNTS_PER_MODULATION', k.countsPerModulation, wordBits, 'counts', 'compare counts per unit of modulation index (half the carrier period)'),
    constantView(c, 'FEEDFORWARD_FACTOR', k.feedForwardFactor, wordBits, 'ratio', 'grid-voltage feed-forward: grid-voltage signal to converter-voltage signal (Vbase / VdcBase in per unit)'),
    constantView(c, 'REACTIVE_FACTOR', k.reactiveFactor, wordBits, 'ratio', 'reactive estimate = factor x low-pass(load current x cos template)'),
  ];
  const limitWord = (word: number): string => (float ? cFloat32(word) : cInt32(word));
  const limits: LimitView[] = set === null ? [] : [
    { macro: `${c.macro}_LIMIT_CURRENT_REFERENCE`, word: limitWord(set.limits.currentReference.word), realMacro: `${c.macro}_LIMIT_CURRENT_REFERENCE_REAL`, real: cDouble(set.limits.currentReference.value), unit: sig('A'), meaning: `clamp of the DC-link PI output (current reference amplitude), ${fmt(r.currentReferencePeakA)} A peak` },
    { macro: `${c.macro}_LIMIT_PLL_FREQUENCY`, word: limitWord(set.limits.pllFrequency.word), realMacro: `${c.macro}_LIMIT_PLL_FREQUENCY_REAL`, real: cDouble(set.limits.pllFrequency.value), unit: sig('rad/s'), meaning: `clamp of the PLL PI output (frequency deviation), +-${fmt(r.pllFrequencyDeviationHz)} Hz` },
    { macro: `${c.macro}_LIMIT_MODULATION`, word: limitWord(set.limits.modulation.word), realMacro: `${c.macro}_LIMIT_MODULATION_REAL`, real: cDouble(set.limits.modulation.value), unit: sig('V'), meaning: `clamp of the PR output (converter voltage over the DC-link base: modulation index ${fmt(r.modulationIndexMax)} at nominal DC link)` },
  ];
  const pis = set === null ? [] : [
    piView(c, 'voltage-pi', set.pi['voltage-pi'], `${c.macro}_LIMIT_CURRENT_REFERENCE`),
    piView(c, 'pll-pi', set.pi['pll-pi'], `${c.macro}_LIMIT_PLL_FREQUENCY`),
  ];
  const fileBase = names.fileBase;
  const arithmetic = float
    ? [
      'structure: per section Direct Form I or delta-operator form, IEEE 754 binary32 (float) throughout',
      'every product and every sum rounded to binary32 in the order the source writes it',
      'build with -ffp-contract=off (no fused multiply-add) on a target where float expressions are evaluated in float (FLT_EVAL_METHOD == 0, C99 5.2.4.2.2): the header refuses to compile otherwise',
      'Direct Form I: acc = b0*x; acc += b1*x1; acc += b2*x2; acc -= a1*y1; acc -= a2*y2; y = clamp(acc)',
      'delta form: y = clamp(b0*x + s1); s1 = clamp2(s1 + d1*x - c1*y + s2); s2 = clamp2(s2 + d2*x - c2*y)',
      'block output: sum = 0; sum += y_i in section order; clamp(sum)',
      'reset: every delay and accumulator 0',
      'coefficients: nearest binary32 (ties to even) of the scaled double, printed as exact hexadecimal literals',
    ]
    : [
      `structure: ${FIXED_ARITHMETIC.structure} (delta-operator form where a section says so), ${FIXED_ARITHMETIC.accumulatorBits}-bit accumulator`,
      `saturation: ${FIXED_ARITHMETIC.saturation}, [${FIXED_ARITHMETIC.saturationMinFormula}, ${FIXED_ARITHMETIC.saturationMaxFormula}]`,
      `rounding constant: ${FIXED_ARITHMETIC.roundingConstantFormula}`,
      `shift: ${FIXED_ARITHMETIC.shift}, rounding ${FIXED_ARITHMETIC.rounding}`,
      'floor shift: computed with right shifts of non-negative values only (floor(v / 2^s) = -(((-(v + 1)) >> s) + 1) for v < 0), no division or modulo',
      `accumulator: ${FIXED_ARITHMETIC.accumulatorOverflow}`,
      'delta form: y = sat((round(B0 x) + s1) >> GUARD); s1 += round(D1 x) - round(C1 y) + s2; s2 += round(D2 x) - round(C2 y); products rounded to 2^-GUARD LSB, states 64-bit, held within +-2 limit 2^GUARD',
      `block output: ${FIXED_ARITHMETIC.blockSum}`,
      `reset: ${FIXED_ARITHMETIC.resetState}`,
      `coefficients: ${FIXED_ARITHMETIC.coefficientRounding}; delta-form coefficients each on their own scale (*_SHIFT)`,
    ];
  return {
    c,
    slug,
    guard: `${c.macro}_COEFS_H`,
    apiGuard: `${c.macro}_FILTER_H`,
    vectorsGuard: `${c.macro}_VECTORS_H`,
    headerFile: `${fileBase}_coefs.h`,
    apiHeaderFile: `${fileBase}_filter.h`,
    sourceFile: `${fileBase}_filter.c`,
    vectorsFile: `${fileBase}_vectors.c`,
    vectorsHeaderFile: `${fileBase}_vectors.h`,
    designName: cell(design.name),
    designNameComment: commentSafe(design.name),
    version: meta.version,
    revision: meta.revision === null ? 'none (working copy)' : String(meta.revision),
    toolVersion: meta.toolVersion,
    createdAt: meta.createdAt.toISOString(),
    draft: meta.draft,
    draftLine: 'DRAFT: not a released set; not reviewed; do not load onto hardware.',
    inputsSha256: sha256Hex(canonicalJson(design)),
    safety: SAFETY_CAUTION,
    wordBits,
    signalMax: float ? cFloat32(FLOAT32_MAX) : cInt32(signalMax(wordBits)),
    sampleTimeS: cDouble(analysis.sampleTimeS),
    float,
    wordType: float ? 'float' : 'int32_t',
    stateType: float ? 'float' : 'int64_t',
    arithmeticTitle: float ? 'single precision (IEEE 754 binary32)' : `${wordBits}-bit fixed point`,
    arithmetic,
    signalFracBits: r.signalFracBits,
    signalFormat: r.signalFormat,
    signalTable: signalTable(design, r).map(commentSafe),
    prefixNote: names.source === 'symbol-prefix'
      ? `C prefix ${c.prefix} / ${c.macro}: the design's firmware symbol prefix (stable across renames).`
      : `C prefix ${c.prefix} / ${c.macro}: derived from the display name; renaming the design changes every name (set a firmware symbol prefix to keep them).`,
    scaling: [
      { macro: `${c.macro}_SCALE_SAMPLE_TIME_S`, value: cDouble(analysis.sampleTimeS), unit: 's', meaning: 'sampling period Ts' },
      { macro: `${c.macro}_SCALE_GRID_FREQUENCY_HZ`, value: cDouble(design.grid.frequencyHz), unit: 'Hz', meaning: 'nominal grid frequency' },
      { macro: `${c.macro}_SCALE_VOLTAGE_BASE_V`, value: cDouble(bases.voltageBaseV), unit: 'V', meaning: 'per-unit voltage base: grid voltage amplitude sqrt(2) * Vrms' },
      { macro: `${c.macro}_SCALE_CURRENT_BASE_A`, value: cDouble(bases.currentBaseA), unit: 'A', meaning: 'per-unit current base: rated current amplitude sqrt(2) * S / Vrms' },
      { macro: `${c.macro}_SCALE_IMPEDANCE_BASE_OHM`, value: cDouble(bases.impedanceBaseOhm), unit: 'ohm', meaning: 'per-unit impedance base: voltage base / current base' },
      { macro: `${c.macro}_SCALE_DC_VOLTAGE_BASE_V`, value: cDouble(bases.dcVoltageBaseV), unit: 'V', meaning: 'DC-link voltage reference (base of the DC-link per-unit)' },
      { macro: `${c.macro}_SCALE_FREQUENCY_BASE_RAD_S`, value: cDouble(bases.angularFrequencyBaseRadPerS), unit: 'rad/s', meaning: 'per-unit frequency base: 2 pi * grid frequency' },
      { macro: `${c.macro}_SCALE_REACTIVE_FACTOR`, value: cDouble(reactiveFactor), unit: '1', meaning: 'reactive estimate q = factor * low-pass(v_q * i)' },
      { macro: `${c.macro}_SCALE_FEEDFORWARD`, value: cDouble(bases.voltageBaseV / bases.dcVoltageBaseV), unit: '1', meaning: 'grid-voltage feed-forward: per-unit grid voltage to modulation index (voltage base / DC-link reference)' },
    ],
    constants,
    limits,
    pis,
    prBlockTable: `${c.prefix}_current_pr_taps`,
    prSectionsMacro: `${c.macro}_CURRENT_PR_SECTIONS`,
    blocks: blocks.map((block) => ({
      id: block.id,
      token: blockToken(block.id),
      method: block.method,
      sectionsMacro: `${c.macro}_${blockToken(block.id).toUpperCase()}_SECTIONS`,
      sectionCount: block.sections.length,
      tableName: `${c.prefix}_${blockToken(block.id)}_taps`,
      scale: fmt(block.sections[0].scaled?.gain ?? 1, 10),
      gains: Object.keys(block.gains).sort().map((name) => {
        const g = block.gains[name];
        return { name, value: Array.isArray(g) ? g.map((v) => fmt(v, 8)).join(', ') : fmt(g, 8), source: block.gainSource?.[name] ?? '—' };
      }),
      sections: block.sections.map((s, i) => presentSection(c, block, s, i, block.sections.length, float)),
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
    vectors: vectors.map((v, i) => {
      const text = (values: readonly number[]): string => rows(values.map((x) => (float ? `0x${float32Bits(x).toString(16).padStart(8, '0')}u` : intText(x)))).map((line) => `  ${line}`).join('\n');
      const kind = v.kind ?? 'block';
      return {
        label: `${v.blockId}/${v.name}`,
        description: commentSafe(v.description),
        inName: `${c.prefix}_vec${i}_in`,
        outName: `${c.prefix}_vec${i}_out`,
        length: v.input.length,
        kindMacro: `${c.macro}_VECTOR_${kind === 'block' ? 'BLOCK' : kind === 'limited-pi' ? 'LIMITED_PI' : 'LIMITED_BLOCK'}`,
        tableName: `${c.prefix}_${blockToken(v.blockId)}_taps`,
        sectionsMacro: `${c.macro}_${blockToken(v.blockId).toUpperCase()}_SECTIONS`,
        piName: v.blockId === 'voltage-pi' || v.blockId === 'pll-pi' ? `&${c.prefix}_${blockToken(v.blockId)}_gains` : 'NULL',
        limit: v.limit === undefined ? `${c.macro}_SIGNAL_MAX` : float ? cFloat32(v.limit) : cInt32(v.limit),
        groupIndex: blockIndex.get(v.blockId) ?? -1,
        inText: text(v.input),
        outText: text(v.expected),
      };
    }),
    vectorCount: vectors.length,
    vectorSamples: vectors.length === 0 ? 0 : vectors[0].input.length,
    maxSections: Math.max(1, ...blocks.map((b) => b.sections.length)),
  };
}

// The firmware set of an analysis, or null when the analysis cannot give one (an analysis stored
// before limits existed still renders its header, without the limit section).
function safeSet(design: DesignInput, analysis: AnalysisResult): FirmwareSet | null {
  try {
    return firmwareSet(design, analysis);
  } catch {
    return null;
  }
}
