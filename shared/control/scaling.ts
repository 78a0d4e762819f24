/**
 * Stage "scaling" of the analysis (CONTRACT section 7): every section gets `scaled`, its numerator
 * multiplied by the block's factor g (per unit: input base / output base; SI: 1), denominator unchanged.
 */
import { scaleDeltaNumerator, type DeltaTaps } from './deltaOperator';
import type { DoubleBlock, DoubleSection } from './sections';
import { blockSignals, resolveSignals } from './signals';
import type { DesignInput, ScaledCoefficients } from './types';

/** A section with its scaled coefficients (and scaled delta-operator form). */
export type ScaledSection = DoubleSection & { scaled: ScaledCoefficients; scaledDeltaTaps: DeltaTaps | null };

/** A block of scaled sections. */
export type ScaledBlock = Omit<DoubleBlock, 'sections'> & { sections: ScaledSection[] };

/**
 * Scales every section to its block's signals.
 *
 * Method: y = H x in SI becomes y/base_out = g H (x/base_in) with g = base_in / base_out, so the
 * numerator is multiplied by g and the dynamics (denominator) stay (CONTRACT section 7 table;
 * `blockSignals` gives g). The delta-operator numerator [b0, d1, d2] is scaled the same way.
 *
 * @param design - a validated design (its `signals.units` decides per unit or SI).
 * @param blocks - the double blocks of the sections stage.
 * @returns the same blocks with `scaled` on every section: `{ units, gain: g, b: g*b, a }`.
 * @example
 * scaleBlocks(sc3, sections.blocks).find((b) => b.id === 'pll-pi')?.sections[0].scaled.gain; // => 1 / (2 pi 60)
 */
export function scaleBlocks(design: DesignInput, blocks: readonly DoubleBlock[]): ScaledBlock[] {
  const signals = blockSignals(design);
  const units = resolveSignals(design).units;
  return blocks.map((block) => {
    const gain = signals.find((s) => s.blockId === block.id)?.gain ?? 1;
    return {
      ...block,
      sections: block.sections.map((s) => ({
        ...s,
        scaled: { units, gain, b: s.b.map((c) => gain * c), a: [...s.a] },
        scaledDeltaTaps: s.deltaTaps === null ? null : scaleDeltaNumerator(s.deltaTaps, gain),
      })),
    };
  });
}
