// Released sets: the list, releasing an approved revision, downloading bundle bytes.
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Release } from '../../shared/api/releases';
import type { DownloadedFile, DownloadProgress } from '../api/client';
import { createRelease, downloadReleaseBundle, getRelease, listReleases, withdrawRelease } from '../api/releases';

/** Released sets visible to everyone. */
export const useReleasesStore = defineStore('releases', () => {
  /** Releases of the last load, newest first. */
  const items = ref<Release[]>([]);
  /** Whether a load has completed at least once. */
  const loaded = ref(false);

  /** Reloads every release. */
  async function load(): Promise<Release[]> {
    const rows = await listReleases();
    items.value = [...rows].sort((x, y) => y.createdAt.localeCompare(x.createdAt));
    loaded.value = true;
    return items.value;
  }

  /** Releases an approved revision under `version` and puts it first in the list. */
  async function release(revisionId: number, version: string): Promise<Release> {
    const created = await createRelease(revisionId, version);
    items.value = [created, ...items.value.filter((r) => r.id !== created.id)];
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

  return { items, loaded, load, loadOne, release, download, withdraw };
});
