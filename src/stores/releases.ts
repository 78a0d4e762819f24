// Released sets: one page of the list, releasing an approved revision, downloading bundle bytes.
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { ListReleasesQuery, Release } from '../../shared/api/releases';
import type { DownloadedFile, DownloadProgress } from '../api/client';
import { createRelease, downloadReleaseBundle, getRelease, listReleases, withdrawRelease } from '../api/releases';

/** Released sets visible to everyone. */
export const useReleasesStore = defineStore('releases', () => {
  /** Releases of the page last loaded, newest first. */
  const items = ref<Release[]>([]);
  /** Releases matching the filters of that load, all pages together. */
  const total = ref(0);
  /** Filters and page of that load. */
  const query = ref<Partial<ListReleasesQuery>>({});
  /** Whether a load has completed at least once. */
  const loaded = ref(false);

  let latest = 0;

  /** Loads one page (by default the query of the last load again); an answer overtaken by a newer load is dropped. */
  async function load(next: Partial<ListReleasesQuery> = query.value): Promise<Release[]> {
    const mine = ++latest;
    const page = await listReleases(next);
    if (mine !== latest) return items.value;
    items.value = [...page.items].sort((x, y) => y.createdAt.localeCompare(x.createdAt));
    total.value = page.total;
    query.value = { ...next };
    loaded.value = true;
    return items.value;
  }

  /** Releases an approved revision under `version` and puts it first in the list. */
  async function release(revisionId: number, version: string): Promise<Release> {
    const created = await createRelease(revisionId, version);
    items.value = [created, ...items.value.filter((r) => r.id !== created.id)];
    total.value += 1;
    return created;
  }

  /** Downloads the bundle of a release. */
  async function download(id: number, onProgress?: (progress: DownloadProgress) => void): Promise<DownloadedFile> {
    return downloadReleaseBundle(id, onProgress);
  }

  /** Loads one release and keeps the list in step with it. */
  async function loadOne(id: number): Promise<Release> {
    const one = await getRelease(id);
    items.value = items.value.map((r) => (r.id === one.id ? one : r));
    return one;
  }

  /** Withdraws a release with a reason; it stays listed, marked. */
  async function withdraw(id: number, reason: string): Promise<Release> {
    const changed = await withdrawRelease(id, reason);
    items.value = items.value.map((r) => (r.id === changed.id ? changed : r));
    return changed;
  }

  return { items, total, query, loaded, load, loadOne, release, download, withdraw };
});
