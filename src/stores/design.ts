// The design open in the workspace: the server's working copy, the edited draft, saving with
// conflict detection, submitting a revision and exporting a draft bundle.
import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import type { DesignInput } from '../../shared/control';
import { ApiError, type DownloadedFile, type DownloadProgress } from '../api/client';
import { downloadDraftBundle, getDesign, saveDesign } from '../api/designs';
import { submitRevision } from '../api/revisions';
import type { DesignDetail, RevisionSummary } from '../api/types';
import { diffDesigns, type DesignChange } from '../composables/designDiff';

/** A save refused with 409: what the other person saved, and how it differs. */
export interface SaveConflict {
  theirs: DesignDetail;
  /** What changed on the server since this edit started (base → theirs). */
  theirChanges: DesignChange[];
  /** Where this draft differs from theirs (theirs → mine). */
  myChanges: DesignChange[];
}

/** The workspace's design. */
export const useDesignStore = defineStore('design', () => {
  /** The working copy as last loaded or saved (the base of the edit). */
  const saved = ref<DesignDetail | null>(null);
  /** The valid design the form currently holds; null while the form has errors. */
  // Replaced whole on every edit, never mutated: shallow, so no deep proxy is built per keystroke.
  const draft = shallowRef<DesignInput | null>(null);
  /** Whether the form holds text that does not validate. */
  const draftInvalid = ref(false);
  /** Set when a save was refused because someone else saved first. */
  const conflict = ref<SaveConflict | null>(null);
  /** Bumped whenever the form must re-read its texts from `saved` (load, reload). */
  const generation = ref(0);

  const dirty = computed(() => {
    if (!saved.value) return false;
    if (draftInvalid.value) return true;
    return draft.value !== null && diffDesigns(saved.value.design, draft.value).length > 0;
  });

  /** Loads a working copy and resets the draft to it. */
  async function load(id: string | number): Promise<DesignDetail> {
    const detail = await getDesign(id);
    adopt(detail);
    return detail;
  }

  function adopt(detail: DesignDetail): void {
    saved.value = detail;
    draft.value = detail.design;
    draftInvalid.value = false;
    conflict.value = null;
    generation.value += 1;
  }

  /** Records what the form holds: a valid design, or null while it has errors. */
  function setDraft(design: DesignInput | null): void {
    draftInvalid.value = design === null;
    if (design) draft.value = design;
  }

  /**
   * Saves the draft. On 409 fills `conflict` (and resolves to null); other errors throw.
   * @param force - save over the server's newer copy (after the user saw the conflict).
   */
  async function save(force = false): Promise<DesignDetail | null> {
    if (!saved.value) throw new Error('No design is open.');
    if (!draft.value || draftInvalid.value) throw new Error('Fix the highlighted fields before saving.');
    const base = force && conflict.value ? conflict.value.theirs.version : saved.value.version;
    try {
      const result = await saveDesign(saved.value.id, draft.value, base);
      saved.value = { ...saved.value, ...result, design: result.design ?? draft.value };
      conflict.value = null;
      return saved.value;
    } catch (cause) {
      if (cause instanceof ApiError && cause.status === 409) {
        const theirs = await getDesign(saved.value.id);
        conflict.value = { theirs, theirChanges: diffDesigns(saved.value.design, theirs.design), myChanges: diffDesigns(theirs.design, draft.value) };
        return null;
      }
      throw cause;
    }
  }

  /** Drops the draft and takes the server's copy from the conflict. */
  function takeTheirs(): void {
    if (conflict.value) adopt(conflict.value.theirs);
  }

  /** Saves when needed, then freezes the working copy as a revision in review. */
  async function submit(summary: string): Promise<RevisionSummary | null> {
    if (!saved.value) throw new Error('No design is open.');
    if (dirty.value && !(await save())) return null;
    const revision = await submitRevision(saved.value.id, summary);
    saved.value = { ...saved.value, latestRevision: revision };
    return revision;
  }

  /** Saves when needed, then builds and downloads a draft bundle. */
  async function exportDraft(onProgress?: (progress: DownloadProgress) => void): Promise<DownloadedFile | null> {
    if (!saved.value) throw new Error('No design is open.');
    if (dirty.value && !(await save())) return null;
    return downloadDraftBundle(saved.value.id, onProgress);
  }

  /** Forgets the open design (leaving the workspace). */
  function close(): void {
    saved.value = null;
    draft.value = null;
    draftInvalid.value = false;
    conflict.value = null;
  }

  return { saved, draft, draftInvalid, conflict, generation, dirty, load, setDraft, save, takeTheirs, submit, exportDraft, close };
});
