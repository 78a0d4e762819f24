// The `varsmith-design/1` schema (CONTRACT section 1), shared by the client form, the API and the CLI.
// Every rejection names the key path and the rule; nothing is defaulted silently.
import { z } from 'zod';
import type { DesignInput } from '../control/types';

// A finite number within [min, max] (or (min, max] with `exclusiveMin`), with the unit in the message.
function bounded(min: number, max: number, unit: string, exclusiveMin = false) {
  const range = `${exclusiveMin ? '(' : '['}${min}, ${max}] ${unit}`.trim();
  return z
    .number({ error: (issue) => (issue.input === undefined ? 'is required' : `must be a number (got ${typeof issue.input})`) })
    .refine((v) => Number.isFinite(v), { message: 'must be a finite number' })
    .refine((v) => (exclusiveMin ? v > min : v >= min) && v <= max, { message: `must lie in ${range}` });
}

// An integer within [min, max].
function integer(min: number, max: number) {
  return bounded(min, max, '').refine((v) => Number.isInteger(v), { message: 'must be an integer' });
}

// A gain that is either null (design it from the targets) or a positive finite number.
function gainOverride(max: number) {
  return z.union([z.null(), bounded(0, max, '', true)], { error: 'must be null (designed from the targets) or a positive number' });
}

const positiveInductanceH = bounded(1e-7, 1, 'H', true);

/** L filter section. */
const lFilterSchema = z.strictObject({
  topology: z.literal('L'),
  inductanceH: positiveInductanceH,
  resistanceOhm: bounded(0, 100, 'Ohm'),
});

/** LCL filter section. */
const lclFilterSchema = z.strictObject({
  topology: z.literal('LCL'),
  inverterInductanceH: positiveInductanceH,
  gridInductanceH: positiveInductanceH,
  capacitanceF: bounded(1e-9, 1e-2, 'F', true),
  dampingResistanceOhm: bounded(0, 1000, 'Ohm'),
  resistanceOhm: bounded(0, 100, 'Ohm'),
});

/** Zod schema of a `varsmith-design/1` file; cross-field rules (Nyquist) are applied by `parseDesign`. */
export const designSchema = z.strictObject({
  format: z.literal('varsmith-design/1', { error: 'must be "varsmith-design/1"' }),
  name: z.string({ error: 'must be a string' }).trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters'),
  grid: z.strictObject({
    voltageRmsV: bounded(1, 1000, 'V', true),
    frequencyHz: bounded(10, 1000, 'Hz'),
  }),
  rating: z.strictObject({ apparentPowerVA: bounded(1, 1e7, 'VA') }),
  filter: z.discriminatedUnion('topology', [lFilterSchema, lclFilterSchema], { error: 'topology must be "L" or "LCL"' }),
  dcLink: z.strictObject({
    capacitanceF: bounded(1e-7, 10, 'F', true),
    voltageRefV: bounded(1, 5000, 'V'),
  }),
  sampling: z.strictObject({
    switchingFrequencyHz: bounded(100, 1e6, 'Hz'),
    updatesPerCarrier: integer(1, 2),
    computationDelaySamples: integer(0, 4),
  }),
  currentLoop: z.strictObject({
    crossoverHz: bounded(0, 1e5, 'Hz', true),
    harmonics: z
      .array(integer(1, 50), { error: 'must be an array of harmonic orders' })
      .min(1, 'must hold at least the fundamental')
      .max(16, 'must hold at most 16 harmonics')
      .refine((hs) => new Set(hs).size === hs.length, { message: 'must not repeat a harmonic' }),
    resonantBandwidthHz: bounded(0, 100, 'Hz'),
    kp: gainOverride(1e6),
    // Nullable array (not a union) so a bad element is reported at its own index, e.g. currentLoop.resonantGains.2.
    resonantGains: z.array(bounded(0, 1e9, '', true), { error: 'must be null or an array of positive numbers' }).nullable(),
  }),
  voltageLoop: z.strictObject({
    crossoverHz: bounded(0, 1e4, 'Hz', true),
    phaseMarginDeg: bounded(1, 89, 'deg'),
    kp: gainOverride(1e6),
    ki: gainOverride(1e9),
  }),
  pll: z.strictObject({
    sogiGain: bounded(0.01, 10, '', true),
    settlingTimeS: bounded(1e-4, 10, 's'),
    dampingRatio: bounded(0.05, 5, ''),
    kp: gainOverride(1e6),
    ki: gainOverride(1e9),
  }),
  reactiveFilter: z.strictObject({
    order: z.union([z.literal(1), z.literal(2)], { error: 'must be 1 or 2' }),
    cutoffHz: bounded(0, 1e4, 'Hz', true),
  }),
  fixedPoint: z.strictObject({
    wordBits: z.union([z.literal(16), z.literal(32)], { error: 'must be 16 or 32' }),
    arithmetic: z.enum(['fixed', 'float32'], { error: 'must be "fixed" or "float32"' }).optional(),
    structure: z.enum(['direct-form-1', 'quantization-robust'], { error: 'must be "direct-form-1" or "quantization-robust"' }).optional(),
  }),
  // CONTRACT section 7: every key optional; the defaults are documented in shared/control/signals.ts.
  signals: z.strictObject({
    units: z.enum(['per-unit', 'si'], { error: 'must be "per-unit" or "si"' }).optional(),
    // At most W - 1 (checked below): a signal word needs its sign bit.
    signalFracBits: integer(0, 31).optional(),
    // Sensor full scales: positive, at most 1 MA / 1 MV (beyond any converter this tool designs for).
    currentSenseFullScaleA: bounded(0, 1e6, 'A', true).optional(),
    gridVoltageSenseFullScaleV: bounded(0, 1e6, 'V', true).optional(),
    dcVoltageSenseFullScaleV: bounded(0, 1e6, 'V', true).optional(),
    // 8 to 24 bits: from the coarsest built-in converters to sigma-delta modulators (common practice, no source).
    adcBits: integer(8, 24).optional(),
    // Up to 2^24 counts: 16- and 32-bit timers, and every count exact in binary32 (common practice, no source).
    pwmCarrierCounts: integer(16, 2 ** 24).optional(),
  }).optional(),
  limits: z.strictObject({
    currentReferencePeakA: bounded(0, 1e6, 'A', true).optional(),
    // A single-phase full bridge modulates linearly up to m = 1 (Holmes & Lipo, "Pulse Width Modulation
    // for Power Converters", 2003, from memory).
    modulationIndexMax: bounded(0, 1, '', true).optional(),
    // Below half the grid frequency (checked below): beyond it the PLL would not be tracking that grid.
    pllFrequencyDeviationHz: bounded(0, 500, 'Hz', true).optional(),
  }).optional(),
  firmware: z.strictObject({
    symbolPrefix: z.string({ error: 'must be a string' })
      .superRefine((v, ctx) => {
        const problem = symbolPrefixProblem(v);
        if (problem !== null) ctx.addIssue({ code: 'custom', message: problem });
      })
      .optional(),
  }).optional(),
  // CONTRACT section 9: the operating envelope the controller (fixed at nominal) must ride.
  envelope: z.strictObject({
    // SCR 1 is the weakest grid that can still carry the rated power at all (IEEE Std 1204-1997 calls
    // below 3 "low", from memory); null = stiff grid only.
    shortCircuitRatioMin: z.union([z.null(), bounded(1, 1e4, '')], { error: 'must be null (stiff grid only) or a number in [1, 10000]' }).optional(),
    // Up to +-50 %: beyond any filter-component tolerance class (common practice, no source).
    filterTolerance: bounded(0, 0.5, '').optional(),
    gridFrequencyHz: z.tuple([bounded(1, 1000, 'Hz'), bounded(1, 1000, 'Hz')], { error: 'must be [min, max] in Hz' }).optional(),
    // Up to +-30 %: wider than the continuous-operation ranges of interconnection rules (common practice, no source).
    gridVoltageTolerance: bounded(0, 0.3, '').optional(),
    dcLinkCapacitanceTolerance: bounded(0, 0.5, '').optional(),
  }).optional(),
});

/** Longest accepted `firmware.symbolPrefix`: with the longest suffix the exporter appends, external names stay within the 31 significant characters C99 guarantees (C99 5.2.4.1). */
export const SYMBOL_PREFIX_MAX_LENGTH = 12;

/**
 * Why a string cannot be the C prefix of an exported set, or null when it can.
 *
 * Rule: 1 to 12 characters, a letter first, then letters and digits in groups joined by single
 * underscores (no leading, trailing or double underscore: C99 7.1.3 reserves leading underscores);
 * functions use the prefix in lower case and macros in upper case, so neither form may start a name
 * the C library reserves: `is`/`to`/`str`/`mem`/`wcs` + a letter (C99 7.26.2, 7.26.11), `E` + a digit or
 * letter (7.26.3), `SIG` (7.26.9), `LC` (7.26.5), `PRI`/`SCN` + a letter (7.26.4), `INT`/`UINT` (7.26.8).
 *
 * @param prefix - candidate prefix as written in the design.
 * @returns a sentence naming the rule broken, or null.
 * @example
 * symbolPrefixProblem('SC3'); // => null
 * symbolPrefixProblem('str_ctl'); // => 'must not start with ...'
 */
export function symbolPrefixProblem(prefix: string): string | null {
  if (prefix.length < 1 || prefix.length > SYMBOL_PREFIX_MAX_LENGTH) return `must be 1 to ${SYMBOL_PREFIX_MAX_LENGTH} characters`;
  if (!/^[A-Za-z][A-Za-z0-9]*(?:_[A-Za-z0-9]+)*$/.test(prefix)) {
    return 'must be a C identifier prefix: a letter, then letters and digits, single underscores between them';
  }
  const lower = prefix.toLowerCase();
  const upper = prefix.toUpperCase();
  if (/^(?:is|to|str|mem|wcs)[a-z]/.test(lower) || /^e[0-9a-z]/.test(lower) || /^sig/.test(lower) || /^lc(?:_|$)/.test(lower)
    || /^(?:pri|scn)[a-z]/.test(lower) || /^u?int/.test(lower) || /^(?:PRI|SCN)X/.test(upper)) {
    return 'must not start with a name the C standard library reserves (is/to/str/mem/wcs + letter, E + letter or digit, SIG, LC, PRI/SCN + letter, INT, UINT)';
  }
  return null;
}

/** The design as the schema infers it. */
export type ParsedDesign = z.infer<typeof designSchema>;

/** One rejected key: `path` like `filter.inductanceH` or `currentLoop.harmonics.2`. */
export interface DesignIssue {
  path: string;
  message: string;
}

/** Outcome of `parseDesign`. */
export type ParseDesignResult = { ok: true; design: DesignInput } | { ok: false; issues: DesignIssue[] };

// Cross-field rules: sampling above twice every resonator frequency and every target below Nyquist.
function crossFieldIssues(d: ParsedDesign): DesignIssue[] {
  const issues: DesignIssue[] = [];
  const sampleRateHz = d.sampling.switchingFrequencyHz * d.sampling.updatesPerCarrier;
  const nyquistHz = sampleRateHz / 2;
  d.currentLoop.harmonics.forEach((h, i) => {
    const hz = h * d.grid.frequencyHz;
    if (hz >= nyquistHz) {
      issues.push({ path: `currentLoop.harmonics.${i}`, message: `harmonic ${h} (${hz} Hz) must lie below Nyquist (${nyquistHz} Hz = half the ${sampleRateHz} Hz sampling rate)` });
    }
  });
  const belowNyquist: [string, number][] = [
    ['currentLoop.crossoverHz', d.currentLoop.crossoverHz],
    ['voltageLoop.crossoverHz', d.voltageLoop.crossoverHz],
    ['reactiveFilter.cutoffHz', d.reactiveFilter.cutoffHz],
  ];
  for (const [path, hz] of belowNyquist) {
    if (hz >= nyquistHz) issues.push({ path, message: `must lie below Nyquist (${nyquistHz} Hz = half the ${sampleRateHz} Hz sampling rate)` });
  }
  if (d.grid.frequencyHz >= nyquistHz) issues.push({ path: 'grid.frequencyHz', message: `must lie below Nyquist (${nyquistHz} Hz)` });
  if (d.currentLoop.resonantGains !== null && d.currentLoop.resonantGains.length !== d.currentLoop.harmonics.length) {
    issues.push({ path: 'currentLoop.resonantGains', message: `must be null or hold one gain per harmonic (${d.currentLoop.harmonics.length})` });
  }
  const wordBits = d.fixedPoint.wordBits;
  if (d.signals?.signalFracBits !== undefined && d.signals.signalFracBits > wordBits - 1) {
    issues.push({ path: 'signals.signalFracBits', message: `must be at most ${wordBits - 1} for ${wordBits}-bit words (one bit is the sign)` });
  }
  if (d.limits?.pllFrequencyDeviationHz !== undefined && d.limits.pllFrequencyDeviationHz >= d.grid.frequencyHz / 2) {
    issues.push({ path: 'limits.pllFrequencyDeviationHz', message: `must lie below half the grid frequency (${d.grid.frequencyHz / 2} Hz)` });
  }
  const band = d.envelope?.gridFrequencyHz;
  if (band !== undefined) {
    const f0 = d.grid.frequencyHz;
    if (!(band[0] < band[1])) issues.push({ path: 'envelope.gridFrequencyHz', message: 'must be [min, max] with min < max' });
    else if (band[0] > f0 || band[1] < f0) issues.push({ path: 'envelope.gridFrequencyHz', message: `must contain the nominal grid frequency (${f0} Hz)` });
    else if (band[0] < 0.8 * f0 || band[1] > 1.2 * f0) {
      // +-20 % is far beyond any ride-through band (IEEE 1547-2018: 56.5 to 62 Hz at 60 Hz, from memory).
      issues.push({ path: 'envelope.gridFrequencyHz', message: `must lie within +-20 % of the nominal grid frequency (${0.8 * f0} to ${1.2 * f0} Hz)` });
    }
  }
  if (d.voltageLoop.crossoverHz >= d.grid.frequencyHz) {
    issues.push({ path: 'voltageLoop.crossoverHz', message: `must lie below the grid frequency (${d.grid.frequencyHz} Hz): the DC-link loop must not follow the twice-grid-frequency ripple` });
  }
  return issues;
}

/**
 * Validates an unknown value as a `varsmith-design/1` design.
 *
 * @param input - parsed JSON of a design file (any value).
 * @returns `{ ok: true, design }` or `{ ok: false, issues }` with one issue per rejected key
 *   (path joined with dots, array indices as numbers), schema rules first, then cross-field rules.
 * @example
 * parseDesign({ format: 'varsmith-design/1' }); // => { ok: false, issues: [{ path: 'name', message: 'must be a string' }, ...] }
 */
export function parseDesign(input: unknown): ParseDesignResult {
  const parsed = designSchema.safeParse(input);
  if (!parsed.success) {
    const issues = parsed.error.issues.map((issue) => ({
      path: issue.path.length > 0 ? issue.path.map(String).join('.') : '(root)',
      message:
        issue.code === 'unrecognized_keys'
          ? `unknown key(s): ${issue.keys.join(', ')}`
          : /received undefined/.test(issue.message)
            ? 'is required'
            : issue.message,
    }));
    return { ok: false, issues };
  }
  const cross = crossFieldIssues(parsed.data);
  if (cross.length > 0) return { ok: false, issues: cross };
  const design: DesignInput = parsed.data;
  return { ok: true, design };
}

/**
 * Formats design issues as one line each, `path: message`.
 *
 * @param issues - issues from `parseDesign`.
 * @returns the lines joined with newlines.
 */
export function formatDesignIssues(issues: readonly DesignIssue[]): string {
  return issues.map((i) => `${i.path}: ${i.message}`).join('\n');
}
