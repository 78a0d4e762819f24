// Reviews and revision comparison (CONTRACT section 6: /api/revisions/:id/reviews, /api/revisions/:a/diff/:b).
import type { CreateReviewRequest, Review, RevisionDiff } from '../../shared/api/revisions';
import { apiRequest } from './client';

function idPart(id: string | number): string {
  return encodeURIComponent(String(id));
}

/**
 * Records a review decision on a revision (reviewers only; the author gets 403).
 * @param revisionId - the revision.
 * @param request - `approve`, or `changes` with the comment explaining them.
 * @returns the stored review.
 */
export async function createReview(revisionId: string | number, request: CreateReviewRequest): Promise<Review> {
  // The server answers with the review, or with the revision whose `reviews` now include it.
  const body = await apiRequest<Review | { review: Review } | { reviews: Review[] }>('POST', `/api/revisions/${idPart(revisionId)}/reviews`, request);
  if ('review' in body) return body.review;
  if ('reviews' in body && !('decision' in body)) {
    const latest = [...body.reviews].sort((x, y) => x.id - y.id).pop();
    if (!latest) throw new Error('The server stored no review.');
    return latest;
  }
  return body as Review;
}

/**
 * Loads what changed from revision `a` to revision `b`.
 * @param fromId - the older revision id.
 * @param toId - the newer revision id.
 * @returns the changes and the unified diff of the generated header.
 */
export async function getRevisionDiff(fromId: string | number, toId: string | number): Promise<RevisionDiff> {
  const body = await apiRequest<RevisionDiff | { diff: RevisionDiff }>('GET', `/api/revisions/${idPart(fromId)}/diff/${idPart(toId)}`);
  return 'diff' in body ? body.diff : body;
}
