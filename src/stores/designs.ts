// The designs list: rows with latest revision and release, and creating a design.
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { DesignInput } from '../../shared/control';
import { contractExampleDesign } from '../../shared/api/designExample';
import { createDesign, listDesigns } from '../api/designs';
import type { DesignDetail, DesignSummary } from '../api/types';

/**
 * A starting design for "new design": the L-filter example of the design-file contract, renamed.
 * Every gain is null (designed by rule).
 * @param name - the new design's name.
 * @returns a complete `varsmith-design/1` design.
 */
export function newDesignTemplate(name: string): DesignInput {
  return contractExampleDesign(name);
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
