// Revisions of a design (CONTRACT section 6: /api/designs/:id/revisions, /api/revisions/:id).
import { PAGE_SIZES, type Page, type PageRequest } from '../../shared/api/paging';
import type { RevisionListItem } from '../../shared/api/revisions';
import { apiPage, apiRequest } from './client';
import type { RevisionDetail, RevisionSummary } from './types';

export type { RevisionListItem } from '../../shared/api/revisions';

/**
 * Freezes the saved working copy as a new revision in review.
 * @param designId - design id.
 * @param summary - what changed, for the reviewer.
 * @returns the new revision.
 */
export async function submitRevision(designId: string | number, summary: string): Promise<RevisionSummary> {
  const body = await apiRequest<RevisionSummary | { revision: RevisionSummary }>('POST', `/api/designs/${encodeURIComponent(String(designId))}/revisions`, { summary });
  return 'revision' in body ? body.revision : body;
}

/**
 * Lists one page of the revisions of a design, newest first as the server orders them.
 * @param designId - design id.
 * @param page - limit and offset (default: the newest page).
 * @param filter - `before`: only the revisions numbered below it.
 * @param filter.before - a revision number.
 * @returns the page (revisions with their reviews) with the number of matching revisions.
 */
export function listRevisions(
  designId: string | number, page: PageRequest = { limit: PAGE_SIZES.revisions.default, offset: 0 }, filter: { before?: number } = {},
): Promise<Page<RevisionListItem>> {
  return apiPage<RevisionListItem>(`/api/designs/${encodeURIComponent(String(designId))}/revisions`, filter, page);
}

/**
 * Loads one revision with its design and analysis.
 * @param id - revision id.
 * @returns the revision.
 */
export async function getRevision(id: string | number): Promise<RevisionDetail> {
  const body = await apiRequest<RevisionDetail | { revision: RevisionDetail }>('GET', `/api/revisions/${encodeURIComponent(String(id))}`);
  return 'revision' in body && !('designId' in body) ? body.revision : (body as RevisionDetail);
}
