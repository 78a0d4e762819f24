// Revision history, comparison and the review queue: what reviewers read and decide on.
import { defineStore } from 'pinia';
import { ref } from 'vue';
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
  /** The revision history of the design last loaded, newest first, with the reviews. */
  const history = ref<RevisionListItem[]>([]);
  /** Design id the history belongs to. */
  const historyDesignId = ref<number | null>(null);
  /** Revisions loaded in full, by id. */
  const details = ref<Record<number, RevisionDetail>>({});
  /** The last comparison loaded. */
  const diff = ref<RevisionDiff | null>(null);

  /** Rebuilds the queue from every design's latest revision that is in review. */
  async function loadQueue(): Promise<QueueEntry[]> {
    const designs = await listDesigns();
    queue.value = designs
      .filter((d) => d.latestRevision?.status === 'in-review')
      .map((d) => ({ designId: d.id, designName: d.name, revision: d.latestRevision as RevisionSummary }))
      .sort((x, y) => x.revision.createdAt.localeCompare(y.revision.createdAt));
    return queue.value;
  }

  /** Loads the revision history of a design, newest first. */
  async function loadHistory(designId: number): Promise<RevisionListItem[]> {
    const rows = await listRevisions(designId);
    history.value = [...rows].sort((x, y) => y.number - x.number);
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

  return { queue, history, historyDesignId, details, diff, loadQueue, loadHistory, loadRevision, loadComparison, decide };
});
