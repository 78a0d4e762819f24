// Assembles presented revisions and releases (the related rows each presenter needs); the list
// views load the related rows of a whole page in a fixed number of queries.
import type { RevisionDetail, RevisionListItem } from '../../shared/api/revisions';
import type { Release } from '../../shared/api/releases';
import { peopleByIds } from '../users/repository';
import { reviewsOf, reviewsOfAll } from '../reviews/repository';
import { findReleaseOfRevision, type ReleaseRow } from '../releases/repository';
import { presentRelease } from '../releases/presenter';
import { designNames } from '../designs/repository';
import { revisionNumbers, type RevisionRow, type RevisionSummaryRow } from './repository';
import { presentReview, presentRevisionDetail, presentRevisionSummary } from './presenter';

/**
 * Full revision view.
 * @param row - the revision.
 * @returns the DTO.
 */
export async function revisionDetailView(row: RevisionRow): Promise<RevisionDetail> {
  const reviews = await reviewsOf(row.id);
  const [people, release] = await Promise.all([peopleByIds([row.authorId, ...reviews.map((r) => r.reviewerId)]), findReleaseOfRevision(row.id)]);
  return presentRevisionDetail(row, people.get(row.authorId) ?? null, reviews.map((r) => presentReview(r, people.get(r.reviewerId) ?? null)),
    release ? { id: release.id, version: release.version } : null);
}

/**
 * Revisions as the history lists them, one page of rows: short form with its reviews (the author reads
 * the comments). Two queries (the reviews, the people) whatever the number of rows.
 * @param rows - the revisions.
 * @returns the DTOs, in the order of `rows`.
 */
export async function revisionListItemViews(rows: readonly RevisionSummaryRow[]): Promise<RevisionListItem[]> {
  const reviews = await reviewsOfAll(rows.map((r) => r.id));
  const people = await peopleByIds([...rows.map((r) => r.authorId), ...[...reviews.values()].flat().map((r) => r.reviewerId)]);
  return rows.map((r) => ({
    ...presentRevisionSummary(r, people.get(r.authorId) ?? null),
    reviews: (reviews.get(r.id) ?? []).map((v) => presentReview(v, people.get(v.reviewerId) ?? null)),
  }));
}

/**
 * Release views of one page of rows: three queries (design names, revision numbers, people) whatever the number of rows.
 * @param rows - the releases.
 * @returns the DTOs, in the order of `rows`.
 */
export async function releaseViews(rows: readonly ReleaseRow[]): Promise<Release[]> {
  const [names, numbers, people] = await Promise.all([
    designNames(rows.map((r) => r.designId)),
    revisionNumbers(rows.map((r) => r.revisionId)),
    peopleByIds(rows.flatMap((r) => (r.withdrawnById === null ? [r.releasedById] : [r.releasedById, r.withdrawnById]))),
  ]);
  return rows.map((row) => presentRelease(row, {
    designName: names.get(row.designId) ?? '',
    revisionNumber: numbers.get(row.revisionId) ?? 0,
    releasedBy: people.get(row.releasedById) ?? null,
    withdrawnBy: row.withdrawnById === null ? null : people.get(row.withdrawnById) ?? null,
  }));
}

/**
 * Release view.
 * @param row - the release.
 * @returns the DTO.
 */
export async function releaseView(row: ReleaseRow): Promise<Release> {
  return (await releaseViews([row]))[0];
}
