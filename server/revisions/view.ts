// Assembles presented revisions and releases (the related rows each presenter needs).
import type { RevisionDetail, RevisionListItem } from '../../shared/api/revisions';
import type { Release } from '../../shared/api/releases';
import { findUser } from '../users/repository';
import { reviewsOf } from '../reviews/repository';
import { listReleaseRows, type ReleaseRow } from '../releases/repository';
import { presentRelease } from '../releases/presenter';
import { findDesign } from '../designs/repository';
import { findRevision, type RevisionRow } from './repository';
import { presentReview, presentRevisionDetail, presentRevisionSummary } from './presenter';

/**
 * Full revision view.
 * @param row - the revision.
 * @returns the DTO.
 */
export async function revisionDetailView(row: RevisionRow): Promise<RevisionDetail> {
  const reviews = await reviewViews(row.id);
  const release = (await listReleaseRows({ designId: row.designId })).find((r) => r.revisionId === row.id);
  return presentRevisionDetail(row, await findUser(row.authorId), reviews, release ? { id: release.id, version: release.version } : null);
}

/**
 * Presented reviews of a revision, oldest first.
 * @param revisionId - revision id.
 * @returns the DTOs.
 */
async function reviewViews(revisionId: number) {
  return Promise.all((await reviewsOf(revisionId)).map(async (r) => presentReview(r, await findUser(r.reviewerId))));
}

/**
 * A revision as the history lists it: short form with its reviews (the author reads the comments).
 * @param row - the revision.
 * @returns the DTO.
 */
export async function revisionListItemView(row: RevisionRow): Promise<RevisionListItem> {
  return { ...presentRevisionSummary(row, await findUser(row.authorId)), reviews: await reviewViews(row.id) };
}

/**
 * Release view.
 * @param row - the release.
 * @returns the DTO.
 */
export async function releaseView(row: ReleaseRow): Promise<Release> {
  return presentRelease(row, {
    designName: (await findDesign(row.designId))?.name ?? '',
    revisionNumber: (await findRevision(row.revisionId))?.number ?? 0,
    releasedBy: await findUser(row.releasedById),
    withdrawnBy: row.withdrawnById === null ? null : await findUser(row.withdrawnById),
  });
}
