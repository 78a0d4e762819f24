/**
 * Stage "quantization" of the analysis: every scaled section gets `fixed` (CONTRACT sections 3 and
 * 7: the W-bit quantization of `scaled`), its form (`structure`: Direct Form I, or the
 * delta-operator form for resonators, SOGI and low-passes when the design asks for the
 * quantization-robust structure), the quantized resonance and fixed-point analysis of the form in
 * use, and, for float32 designs, what single precision does to it.
 */
import { deltaResonanceHz, dequantizeDelta, quantizeDelta } from './deltaOperator';
import { analyzeDeltaSection, analyzeFixedSection, quantizedResonanceHz } from './fixedPoint';
import { analyzeFloat32Section, FLOAT32_STALL_INPUT_PU } from './float32';
import { quantizeSection } from './quantize';
import type { ScaledBlock, ScaledSection } from './scaling';
import { blockSignals, resolveSignals } from './signals';
import type { BlockResult, DeltaSection, DesignInput, SectionResult } from './types';

/** What the quantization of one section depends on. */
export interface QuantizationContext {
  samplePeriodS: number;
  wordBits: number;
  arithmetic: 'fixed' | 'float32';
  structure: 'direct-form-1' | 'quantization-robust';
  /** The number the block input holds for 1 pu (1 per unit, the base in SI), for the float32 stall run. */
  inputOnePu: number;
}

/**
 * Quantizes one scaled section (see the module comment).
 *
 * @param s - the scaled section.
 * @param context - sampling period, word, arithmetic, structure, input scale.
 * @returns the section as the analysis result holds it.
 * @example
 * quantizeScaledSection(section, { samplePeriodS: 5e-5, wordBits: 16, arithmetic: 'fixed', structure: 'quantization-robust', inputOnePu: 1 }).structure;
 * // => 'delta-operator' for a resonator
 */
export function quantizeScaledSection(s: ScaledSection, context: QuantizationContext): SectionResult {
  const ts = context.samplePeriodS;
  const fixed = quantizeSection(s.scaled.b, s.scaled.a, context.wordBits);
  const robust = context.structure === 'quantization-robust' && s.scaledDeltaTaps !== null;
  const delta: DeltaSection | undefined = robust && s.scaledDeltaTaps
    ? { form: 'delta-operator', coefficients: [...s.scaledDeltaTaps], fixed: quantizeDelta(s.scaledDeltaTaps, context.wordBits) }
    : undefined;
  const out: SectionResult = { role: s.role, kind: s.kind, prewarpHz: s.prewarpHz, b: s.b, a: s.a, fixed };
  if (s.resonanceHz) {
    let fixedHz: number | null;
    if (delta) {
      const q = dequantizeDelta(delta.fixed);
      fixedHz = deltaResonanceHz(q[3], q[4], ts);
    } else {
      fixedHz = quantizedResonanceHz(fixed, ts);
    }
    out.resonanceHz = { ...s.resonanceHz, fixed: fixedHz };
  }
  if (s.resonanceByMethodHz) out.resonanceByMethodHz = s.resonanceByMethodHz;
  out.scaled = s.scaled;
  out.structure = delta ? 'delta-operator' : 'direct-form-1';
  if (delta) out.delta = delta;
  out.fixedAnalysis = delta
    ? analyzeDeltaSection(delta.coefficients, delta.fixed)
    : analyzeFixedSection({ role: s.role, kind: s.kind, b: s.scaled.b, a: s.scaled.a, prewarpHz: s.prewarpHz }, fixed, ts);
  if (context.arithmetic === 'float32') {
    const b = s.scaled.b;
    const a = s.scaled.a;
    const sumA = a[0] + a[1] + a[2];
    const float32 = analyzeFloat32Section({
      kind: s.kind,
      form: out.structure,
      coefficients: delta ? delta.coefficients : [b[0], b[1], b[2], a[1], a[2]],
      prewarpHz: s.prewarpHz,
      resonant: s.resonanceHz !== undefined,
      stallInput: FLOAT32_STALL_INPUT_PU * context.inputOnePu,
    }, ts, sumA === 0 ? null : (b[0] + b[1] + b[2]) / sumA);
    out.float32 = float32;
    if (out.resonanceHz) out.resonanceHz = { ...out.resonanceHz, float32: float32.resonanceHz };
  }
  return out;
}

/**
 * Quantizes every section of every block of a design.
 *
 * @param design - a validated design (word, arithmetic, structure and units).
 * @param blocks - the scaled blocks.
 * @param samplePeriodS - Ts in seconds.
 * @returns the blocks of the analysis result.
 * @example
 * quantizeBlocks(design, scaleBlocks(design, sections.blocks), 5e-5)[2].sections[1].fixed.qFormat; // => 'Q2.30'
 */
export function quantizeBlocks(design: DesignInput, blocks: readonly ScaledBlock[], samplePeriodS: number): BlockResult[] {
  const resolved = resolveSignals(design);
  const signals = blockSignals(design);
  return blocks.map((block) => {
    const context: QuantizationContext = {
      samplePeriodS,
      wordBits: design.fixedPoint.wordBits,
      arithmetic: resolved.arithmetic,
      structure: resolved.structure,
      inputOnePu: signals.find((x) => x.blockId === block.id)?.input.onePu ?? 1,
    };
    return { ...block, sections: block.sections.map((s) => quantizeScaledSection(s, context)) };
  });
}
