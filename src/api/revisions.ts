// Revisions of a design (CONTRACT section 6: /api/designs/:id/revisions, /api/revisions/:id).
import { apiRequest } from './client';
import type { RevisionListItem } from '../../shared/api/revisions';
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
 * Lists the revisions of a design, newest first as the server orders them.
 * @param designId - design id.
 * @returns the revisions with their reviews.
 */
export async function listRevisions(designId: string | number): Promise<RevisionListItem[]> {
  const body = await apiRequest<RevisionListItem[] | { revisions: RevisionListItem[] }>('GET', `/api/designs/${encodeURIComponent(String(designId))}/revisions`);
  return Array.isArray(body) ? body : body.revisions;
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
