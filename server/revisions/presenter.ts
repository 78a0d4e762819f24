// Serialises revisions and reviews.
import type { RevisionSummary } from '../../shared/api/designs';
import type { Review, RevisionDetail } from '../../shared/api/revisions';
import type { ReviewRow } from '../reviews/repository';
import type { PersonRow } from '../users/repository';
import { presentPerson } from '../users/presenter';
import type { RevisionRow, RevisionSummaryRow } from './repository';

/**
 * Short form.
 * @param row - the revision.
 * @param author - its author.
 * @returns the DTO.
 */
export function presentRevisionSummary(row: RevisionSummaryRow, author: PersonRow | null): RevisionSummary {
  return {
    id: row.id, designId: row.designId, number: row.number, status: row.status, summary: row.summary,
    createdAt: row.createdAt.toISOString(), author: presentPerson(author), errorCount: row.errorCount, warningCount: row.warningCount,
  };
}

/**
 * One review.
 * @param row - the review.
 * @param reviewer - who decided.
 * @returns the DTO.
 */
export function presentReview(row: ReviewRow, reviewer: PersonRow | null): Review {
  return { id: row.id, revisionId: row.revisionId, reviewer: presentPerson(reviewer), decision: row.decision, comment: row.comment, createdAt: row.createdAt.toISOString() };
}

/**
 * Full form with design, analysis, reviews and release.
 * @param row - the revision.
 * @param author - its author.
 * @param reviews - presented reviews.
 * @param release - its release, if any.
 * @returns the DTO.
 */
export function presentRevisionDetail(row: RevisionRow, author: PersonRow | null, reviews: Review[], release: { id: number; version: string } | null): RevisionDetail {
  return { ...presentRevisionSummary(row, author), designName: row.design.name, design: row.design, analysis: row.analysis, reviews, release };
}
