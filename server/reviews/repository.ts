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

/**
 * Reviews of several revisions in one query, oldest first.
 * @param revisionIds - revision ids (one page of rows' worth).
 * @returns the rows by revision id (revisions without reviews are absent).
 */
export async function reviewsOfAll(revisionIds: readonly number[]): Promise<Map<number, ReviewRow[]>> {
  const out = new Map<number, ReviewRow[]>();
  if (revisionIds.length === 0) return out;
  for (const m of await ReviewModel.findAll({ where: { revisionId: [...new Set(revisionIds)] }, order: [['id', 'ASC']] })) {
    out.set(m.revisionId, [...(out.get(m.revisionId) ?? []), plain(m)]);
  }
  return out;
}
