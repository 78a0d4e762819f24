/**
 * The double-precision twin of the firmware control step (CONTRACT section 8's structure), used to
 * validate the plant and the simulator, and as the reference a bit-exact step is compared with.
 *
 * Per sample, from signed ADC codes: SOGI (the `sogi-d` and `sogi-q` sections) -> PLL (q-axis
 * error normalised by the SOGI amplitude, `pll-pi` with its output clamped to the frequency limit,
 * angle integrator with wrap, sine and cosine) -> reactive estimator (load current x cos template,
 * `reactive-lpf`, x 2) -> DC-link PI (`voltage-pi`, output clamped to the current limit) -> current
 * reference i_ref = q cos(theta) - i_d sin(theta), clamped -> PR (`current-pr`: proportional plus
 * resonators) -> grid-voltage feed-forward -> modulation normalised by the measured DC-link voltage ->
 * modulation clamp -> unipolar compare values.
 *
 * Conventions: the grid voltage is v = V sin(theta); the inverter current is positive out of the
 * bridge; the DC-link PI output i_d > 0 draws active power into the DC link.
 *
 * Anti-windup: the PIs run in velocity form y[n] = y[n-1] + b0 e[n] + b1 e[n-1] (their Tustin
 * sections, a1 = -1) with the output clamped, which stops the integral at the limit (clamping;
 * Åström & Hägglund, "Advanced PID Control", 2006, sec. 3.5, from memory). The resonator states are
 * not advanced in a sample whose modulation is clamped (conditional integration, same source).
 *
 * Coefficients: the designed doubles of the analysis (`double`), or the coefficients the set ships
 * (`quantized`: integers or binary32 values in the set's form, see `sectionCoefficients`), run in
 * double precision: the resonance drift of a short word shows up, its arithmetic rounding does not.
 */
import { dequantizeDelta, directFormFromDelta, perUnitBases, resolveSignals, type AnalysisResult, type BlockId, type DesignInput, type SectionResult } from '../control';
import type { AdcCodes, ControllerOutput, SampledController } from './controller';
import { designSensing, unipolarCompares, type Quantization } from './sensing';

/** Which coefficients the reference runs. */
export type CoefficientSet = 'double' | 'quantized';

/** Options of {@link createReferenceController}. */
export interface ReferenceControllerOptions {
  coefficients: CoefficientSet;
  /** `firmware` rounds the compare values to whole counts; `none` keeps them real. */
  quantization: Quantization;
}

/** PLL error is held at 0 while the SOGI amplitude is below this fraction of the nominal peak (no grid: no phase). */
export const PLL_AMPLITUDE_MIN_FRACTION = 0.05;

/** DC-link voltage below this fraction of the reference is treated as this value when normalising the modulation. */
export const DC_VOLTAGE_MIN_FRACTION = 0.05;

/** One Direct Form I section, y[n] = b0 x[n] + b1 x[n-1] + b2 x[n-2] - a1 y[n-1] - a2 y[n-2]. */
export class Df1Section {
  private x1 = 0;
  private x2 = 0;
  private y1 = 0;
  private y2 = 0;

  /**
   * @param b - [b0, b1, b2].
   * @param a - [1, a1, a2].
   */
  constructor(private readonly b: readonly number[], private readonly a: readonly number[]) {}

  /** Zeroes the state. */
  reset(): void {
    this.x1 = 0; this.x2 = 0; this.y1 = 0; this.y2 = 0;
  }

  /**
   * Output for input x without advancing the state.
   * @param x - input.
   * @returns y[n].
   */
  peek(x: number): number {
    return this.b[0] * x + this.b[1] * this.x1 + this.b[2] * this.x2 - this.a[1] * this.y1 - this.a[2] * this.y2;
  }

  /**
   * Advances the state with input x and output y (the output may be a clamped value).
   * @param x - input.
   * @param y - output to remember.
   */
  commit(x: number, y: number): void {
    this.x2 = this.x1; this.x1 = x; this.y2 = this.y1; this.y1 = y;
  }

  /**
   * One step: peek then commit.
   * @param x - input.
   * @returns y[n].
   */
  step(x: number): number {
    const y = this.peek(x);
    this.commit(x, y);
    return y;
  }

  /**
   * One step with the output clamped to [-limit, limit] and remembered clamped (anti-windup of a velocity-form PI).
   * @param x - input.
   * @param limit - clamp, >= 0.
   * @returns the clamped output.
   */
  stepClamped(x: number, limit: number): number {
    const y = Math.min(limit, Math.max(-limit, this.peek(x)));
    this.commit(x, y);
    return y;
  }
}

/**
 * The SI coefficients of one analysed section, as Direct Form I taps.
 *
 * `double`: the designed section (b, a). `quantized`: what the set ships, divided back to SI (the
 * numerator by the block's scale factor g, CONTRACT section 7): the binary32 coefficients when the
 * design's arithmetic is float32; the delta-operator integers times 2^-F, turned into Direct Form I
 * taps, for a quantization-robust section; else the Direct Form I integers times 2^-F.
 *
 * @param section - a section of the analysis result.
 * @param coefficients - `double` or `quantized`.
 * @returns `{ b, a }` with three entries each and a[0] = 1.
 * @example
 * sectionCoefficients(section, 'double'); // => { b: section.b, a: section.a }
 */
export function sectionCoefficients(section: SectionResult, coefficients: CoefficientSet): { b: number[]; a: number[] } {
  if (coefficients === 'double') return { b: [...section.b], a: [1, section.a[1], section.a[2]] };
  const g = section.scaled?.gain ?? 1;
  const unscale = (taps: { b: number[]; a: number[] }) => ({ b: taps.b.map((v) => v / g), a: [1, taps.a[1], taps.a[2]] });
  const shipped = section.float32;
  if (shipped) {
    const c = shipped.coefficients;
    return unscale(shipped.form === 'delta-operator' ? directFormFromDelta(c) : { b: [c[0], c[1], c[2]], a: [1, c[3], c[4]] });
  }
  if (section.structure === 'delta-operator' && section.delta) return unscale(directFormFromDelta(dequantizeDelta(section.delta.fixed)));
  const scale = 2 ** -section.fixed.fracBits;
  return unscale({ b: section.fixed.b.map((v) => v * scale), a: section.fixed.a.map((v) => v * scale) });
}

function blockSections(analysis: AnalysisResult, id: BlockId, coefficients: CoefficientSet): Df1Section[] {
  const block = analysis.blocks.find((b) => b.id === id);
  if (!block) throw new Error(`analysis has no block ${id}`);
  return block.sections.map((s) => {
    const c = sectionCoefficients(s, coefficients);
    return new Df1Section(c.b, c.a);
  });
}

/** The reference controller with a description of what it is. */
export interface ReferenceController extends SampledController {
  /** What runs in the loop, for the result. */
  description: { kind: 'double-reference'; coefficients: CoefficientSet };
}

/**
 * Builds the double-precision reference control step of a design from its analysis.
 *
 * @param design - the validated design (limits, sensing, DC-link reference, sampling).
 * @param analysis - its `varsmith-analysis/1` result (the sections of every block).
 * @param options - coefficients and compare rounding.
 * @returns the controller (reset).
 * @example
 * const c = createReferenceController(design, analyzeDesign(design, noPlots), { coefficients: 'double', quantization: 'firmware' });
 * c.step({ inverterCurrent: 0, loadCurrent: 0, gridVoltage: 0, dcVoltage: 1365 }).compareA; // => 1250 (m = 0)
 */
export function createReferenceController(design: DesignInput, analysis: AnalysisResult, options: ReferenceControllerOptions): ReferenceController {
  const sensing = designSensing(design);
  const limits = resolveSignals(design);
  const bases = perUnitBases(design);
  const samplePeriodS = analysis.sampleTimeS;
  const w0 = bases.angularFrequencyBaseRadPerS;
  const dwMax = 2 * Math.PI * limits.pllFrequencyDeviationHz;
  const iMax = limits.currentReferencePeakA;
  const mMax = limits.modulationIndexMax;
  const vRef = design.dcLink.voltageRefV;
  const ampMin = PLL_AMPLITUDE_MIN_FRACTION * bases.voltageBaseV;
  const vdcMin = DC_VOLTAGE_MIN_FRACTION * vRef;
  const c = options.coefficients;
  const [sogiD] = blockSections(analysis, 'sogi-d', c);
  const [sogiQ] = blockSections(analysis, 'sogi-q', c);
  const [pllPi] = blockSections(analysis, 'pll-pi', c);
  const [voltagePi] = blockSections(analysis, 'voltage-pi', c);
  const [lowPass] = blockSections(analysis, 'reactive-lpf', c);
  const pr = blockSections(analysis, 'current-pr', c);
  const prOut = new Float64Array(pr.length);
  let theta = 0;

  const reset = (): void => {
    for (const s of [sogiD, sogiQ, pllPi, voltagePi, lowPass, ...pr]) s.reset();
    theta = 0;
  };

  const step = (codes: AdcCodes): ControllerOutput => {
    const iInv = codes.inverterCurrent * sensing.currentAPerCode;
    const iLoad = codes.loadCurrent * sensing.currentAPerCode;
    const vGrid = codes.gridVoltage * sensing.gridVoltageVPerCode;
    const vDc = codes.dcVoltage * sensing.dcVoltageVPerCode;
    // SOGI: in-phase and quadrature (lagging) copies of the grid voltage.
    const vAlpha = sogiD.step(vGrid);
    const vBeta = sogiQ.step(vGrid);
    // PLL: e = (v_alpha cos(theta) + v_beta sin(theta)) / |v| = sin(phase - theta).
    const sinT = Math.sin(theta);
    const cosT = Math.cos(theta);
    const amplitude = Math.hypot(vAlpha, vBeta);
    const error = amplitude > ampMin ? (vAlpha * cosT + vBeta * sinT) / amplitude : 0;
    const dw = pllPi.stepClamped(error, dwMax);
    const omega = w0 + dw;
    // Reactive estimator: the load current's amplitude along cos(theta).
    const q = 2 * lowPass.step(iLoad * cosT);
    const qRef = Math.min(iMax, Math.max(-iMax, q));
    // DC-link PI: active current amplitude drawn into the DC link.
    const id = voltagePi.stepClamped(vRef - vDc, iMax);
    const iRef = Math.min(iMax, Math.max(-iMax, qRef * cosT - id * sinT));
    // PR with grid-voltage feed-forward, normalised by the measured DC-link voltage.
    const e = iRef - iInv;
    let vPr = 0;
    for (let k = 0; k < pr.length; k++) { prOut[k] = pr[k].peek(e); vPr += prOut[k]; }
    const m = (vPr + vGrid) / Math.max(vDc, vdcMin);
    const mClamped = Math.min(mMax, Math.max(-mMax, m));
    if (mClamped === m) for (let k = 0; k < pr.length; k++) pr[k].commit(e, prOut[k]);
    const { compareA, compareB } = unipolarCompares(mClamped, sensing.carrierCounts, options.quantization);
    const angle = theta;
    theta += omega * samplePeriodS;
    if (theta >= 2 * Math.PI) theta -= 2 * Math.PI;
    else if (theta < 0) theta += 2 * Math.PI;
    return {
      compareA,
      compareB,
      log: {
        pllFrequencyHz: omega / (2 * Math.PI),
        pllAngleRad: angle,
        reactiveCurrentEstimateA: q,
        currentReferenceA: iRef,
        activeCurrentReferenceA: id,
        modulationIndex: mClamped,
      },
    };
  };

  return { reset, step, description: { kind: 'double-reference', coefficients: c } };
}
