// The designs list: rows with latest revision and release, and creating a design.
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { DesignInput } from '../../shared/control';
import { createDesign, listDesigns } from '../api/designs';
import type { DesignDetail, DesignSummary } from '../api/types';

/**
 * A starting design for "new design": the L-filter example of the design-file contract, renamed.
 * Every gain is null (designed by rule).
 * @param name - the new design's name.
 * @returns a complete `varsmith-design/1` design.
 */
export function newDesignTemplate(name: string): DesignInput {
  return {
    format: 'varsmith-design/1',
    name,
    grid: { voltageRmsV: 120, frequencyHz: 60 },
    rating: { apparentPowerVA: 3300 },
    filter: { topology: 'L', inductanceH: 0.0006, resistanceOhm: 0.03 },
    dcLink: { capacitanceF: 0.0022, voltageRefV: 200 },
    sampling: { switchingFrequencyHz: 20000, updatesPerCarrier: 1, computationDelaySamples: 1 },
    currentLoop: { crossoverHz: 1000, harmonics: [1, 3, 5, 7], resonantBandwidthHz: 0.5, kp: null, resonantGains: null },
    voltageLoop: { crossoverHz: 12, phaseMarginDeg: 60, kp: null, ki: null },
    pll: { sogiGain: Math.SQRT2, settlingTimeS: 0.06, dampingRatio: 0.7071, kp: null, ki: null },
    reactiveFilter: { order: 2, cutoffHz: 10 },
    fixedPoint: { wordBits: 32 },
  };
}

/** Designs visible to the signed-in user. */
export const useDesignsStore = defineStore('designs', () => {
  /** Rows of the last successful load. */
  const items = ref<DesignSummary[]>([]);
  /** Whether a load has completed at least once (distinguishes "empty" from "not loaded"). */
  const loaded = ref(false);

  /** Reloads the list from the server. */
  async function load(): Promise<DesignSummary[]> {
    items.value = await listDesigns();
    loaded.value = true;
    return items.value;
  }

  /** Creates a design from the template (or a given file) and adds it to the list. */
  async function create(name: string, design?: DesignInput): Promise<DesignDetail> {
    const created = await createDesign(design ?? newDesignTemplate(name));
    items.value = [created, ...items.value.filter((d) => d.id !== created.id)];
    return created;
  }

  return { items, loaded, load, create };
});
