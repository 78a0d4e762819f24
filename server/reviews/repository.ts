// Review storage; returns plain objects.
import type { Transaction } from 'sequelize';
import type { ReviewDecision } from '../../shared/api/revisions';
import { ReviewModel } from './model';

/** A review row. */
export interface ReviewRow {
  id: number;
  revisionId: number;
  reviewerId: number;
  decision: ReviewDecision;
  comment: string;
  createdAt: Date;
}

const plain = (m: ReviewModel): ReviewRow => ({ id: m.id, revisionId: m.revisionId, reviewerId: m.reviewerId, decision: m.decision, comment: m.comment, createdAt: m.createdAt });

/**
 * Inserts a review.
 * @param data - fields.
 * @param transaction - the write transaction.
 * @returns the row.
 */
export async function insertReview(data: Omit<ReviewRow, 'id' | 'createdAt'>, transaction: Transaction): Promise<ReviewRow> {
  return plain(await ReviewModel.create(data, { transaction }));
}

/**
 * Reviews of a revision, oldest first.
 * @param revisionId - revision id.
 * @returns the rows.
 */
export async function reviewsOf(revisionId: number): Promise<ReviewRow[]> {
  return (await ReviewModel.findAll({ where: { revisionId }, order: [['id', 'ASC']] })).map(plain);
}
