// The designs list: one page of rows with latest revision and release, and creating a design.
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { DesignInput } from '../../shared/control';
import { contractExampleDesign } from '../../shared/api/designExample';
import type { RevisionStatus } from '../../shared/api/designs';
import { PAGE_SIZES } from '../../shared/api/paging';
import { createDesign, listDesigns, type DesignListQuery } from '../api/designs';
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
  /** Rows of the page last loaded. */
  const items = ref<DesignSummary[]>([]);
  /** Designs matching the filters of that load, all pages together. */
  const total = ref(0);
  /** Filters, order and page of that load. */
  const query = ref<DesignListQuery>({});
  /** Whether a load has completed at least once (distinguishes "empty" from "not loaded"). */
  const loaded = ref(false);

  let latest = 0;

  /** Loads one page (by default the query of the last load again); an answer overtaken by a newer load is dropped. */
  async function load(next: DesignListQuery = query.value): Promise<DesignSummary[]> {
    const mine = ++latest;
    const page = await listDesigns(next);
    if (mine !== latest) return items.value;
    items.value = page.items;
    total.value = page.total;
    query.value = { ...next };
    loaded.value = true;
    return items.value;
  }

  /** Designs whose latest revision has `status` (at most the largest page); the list is left as it is. */
  async function withLatestStatus(status: RevisionStatus): Promise<{ items: DesignSummary[]; total: number }> {
    const page = await listDesigns({ status, limit: PAGE_SIZES.designs.max });
    return { items: page.items, total: page.total };
  }

  /** One design's row, found by id wherever it is in the list; the list is left as it is. */
  async function summary(id: number): Promise<DesignSummary | null> {
    return (await listDesigns({ id, limit: 1 })).items[0] ?? null;
  }

  /** Creates a design from the template (or a given file) and adds it to the list. */
  async function create(name: string, design?: DesignInput): Promise<DesignDetail> {
    const created = await createDesign(design ?? newDesignTemplate(name));
    items.value = [created, ...items.value.filter((d) => d.id !== created.id)];
    total.value += 1;
    return created;
  }

  return { items, total, query, loaded, load, withLatestStatus, summary, create };
});
