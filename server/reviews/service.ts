// Four-eyes review: reviewers decide on revisions in review, never on their own.
import type { CreateReviewRequest } from '../../shared/api/revisions';
import { conflict, forbidden, notFound } from '../errors';
import { record } from '../audit/service';
import type { AppContext, UserActor } from '../middleware/context';
import { notifyUser } from '../mail/notify';
import { lockRevision, setRevisionStatus } from '../revisions/repository';
import { insertReview, type ReviewRow } from './repository';

/**
 * Records a decision: approve → `approved`, changes → `changes-requested`; the author is e-mailed.
 * @param app - services.
 * @param actor - the reviewer.
 * @param revisionId - revision id.
 * @param input - decision and comment.
 * @returns the review.
 */
export async function decide(app: AppContext, actor: UserActor, revisionId: number, input: CreateReviewRequest): Promise<{ review: ReviewRow; authorId: number; designName: string; number: number }> {
  const out = await app.db.write(async (t) => {
    const revision = await lockRevision(revisionId, t);
    if (!revision) throw notFound(`revision ${revisionId}`);
    if (revision.authorId === actor.id) throw forbidden('four-eyes rule: nobody reviews their own revision');
    if (revision.status !== 'in-review') throw conflict('not-in-review', `revision ${revision.number} is ${revision.status}, not in review`, { status: revision.status });
    const review = await insertReview({ revisionId, reviewerId: actor.id, decision: input.decision, comment: input.comment }, t);
    await setRevisionStatus(revisionId, input.decision === 'approve' ? 'approved' : 'changes-requested', t);
    await record(t, actor, input.decision === 'approve' ? 'review.approve' : 'review.changes', 'revision', revisionId, { designId: revision.designId, number: revision.number, comment: input.comment });
    return { review, authorId: revision.authorId, designName: revision.design.name, number: revision.number };
  });
  const verdict = input.decision === 'approve' ? 'approved' : 'sent back with requested changes';
  await notifyUser(app, out.authorId, `[Varsmith] ${out.designName} r${out.number} ${verdict}`,
    `${actor.name} ${verdict} revision r${out.number} of "${out.designName}".\n\n${input.comment ? `Comment: ${input.comment}\n\n` : ''}Open it: ${app.config.publicUrl}/revisions/${revisionId}\n`);
  return out;
}
