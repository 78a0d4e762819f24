// Revision history, comparison and the review queue: what reviewers read and decide on.
import { defineStore } from 'pinia';
import { ref } from 'vue';
import { PAGE_SIZES, type PageRequest } from '../../shared/api/paging';
import type { CreateReviewRequest, Review, RevisionDiff } from '../../shared/api/revisions';
import { listDesigns } from '../api/designs';
import { createReview, getRevisionDiff } from '../api/reviews';
import { getRevision, listRevisions, type RevisionListItem } from '../api/revisions';
import type { RevisionDetail, RevisionSummary } from '../api/types';

/** One revision waiting for a review, with the design it belongs to. */
export interface QueueEntry {
  designId: number;
  designName: string;
  revision: RevisionSummary;
}

/** Revisions, their comparison and review decisions. */
export const useReviewStore = defineStore('review', () => {
  /** Revisions in review, oldest submission first (first come, first reviewed). */
  const queue = ref<QueueEntry[]>([]);
  /** Designs waiting for a review in all (the queue holds at most the largest page of them). */
  const queueTotal = ref(0);
  /** One page of the revision history of the design last loaded, newest first, with the reviews. */
  const history = ref<RevisionListItem[]>([]);
  /** Revisions of that design in all. */
  const historyTotal = ref(0);
  /** The page of `history`. */
  const historyPage = ref<PageRequest>({ limit: PAGE_SIZES.revisions.default, offset: 0 });
  /** The revision just older than the page's last one (what that row compares with), null on the last page. */
  const historyOlder = ref<RevisionListItem | null>(null);
  /** Design id the history belongs to. */
  const historyDesignId = ref<number | null>(null);
  /** Revisions loaded in full, by id. */
  const details = ref<Record<number, RevisionDetail>>({});
  /** The last comparison loaded. */
  const diff = ref<RevisionDiff | null>(null);

  /** Rebuilds the queue from the designs whose latest revision is in review. */
  async function loadQueue(): Promise<QueueEntry[]> {
    const designs = await listDesigns({ status: 'in-review', limit: PAGE_SIZES.designs.max });
    queueTotal.value = designs.total;
    queue.value = designs.items
      .filter((d) => d.latestRevision?.status === 'in-review')
      .map((d) => ({ designId: d.id, designName: d.name, revision: d.latestRevision as RevisionSummary }))
      .sort((x, y) => x.revision.createdAt.localeCompare(y.revision.createdAt));
    return queue.value;
  }

  /**
   * Loads one page of the revision history of a design, newest first, and the revision just before
   * the page (one row more is asked for, up to the largest page).
   */
  async function loadHistory(designId: number, page: PageRequest = { limit: PAGE_SIZES.revisions.default, offset: 0 }): Promise<RevisionListItem[]> {
    const ask = Math.min(page.limit + 1, PAGE_SIZES.revisions.max);
    const loaded = await listRevisions(designId, { limit: ask, offset: page.offset });
    const rows = [...loaded.items].sort((x, y) => y.number - x.number);
    history.value = rows.slice(0, page.limit);
    historyOlder.value = rows[page.limit] ?? null;
    historyTotal.value = loaded.total;
    historyPage.value = { ...page };
    historyDesignId.value = designId;
    return history.value;
  }

  /** Loads one revision in full (design, analysis, reviews) and keeps it by id. */
  async function loadRevision(id: number): Promise<RevisionDetail> {
    const detail = await getRevision(id);
    details.value = { ...details.value, [detail.id]: detail };
    return detail;
  }

  /** Loads both revisions and the server's diff from `fromId` to `toId`. */
  async function loadComparison(fromId: number, toId: number): Promise<{ from: RevisionDetail; to: RevisionDetail; diff: RevisionDiff }> {
    const [from, to, changes] = await Promise.all([loadRevision(fromId), loadRevision(toId), getRevisionDiff(fromId, toId)]);
    diff.value = changes;
    return { from, to, diff: changes };
  }

  /** Records a decision, then refreshes the revision and drops it from the queue. */
  async function decide(revisionId: number, request: CreateReviewRequest): Promise<Review> {
    const review = await createReview(revisionId, request);
    queue.value = queue.value.filter((e) => e.revision.id !== revisionId);
    if (details.value[revisionId]) await loadRevision(revisionId);
    return review;
  }

  return {
    queue, queueTotal, history, historyTotal, historyPage, historyOlder, historyDesignId, details, diff,
    loadQueue, loadHistory, loadRevision, loadComparison, decide,
  };
});
