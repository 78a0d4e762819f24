// Designs and their working copies (CONTRACT section 6: /api/designs).
import type { DesignInput } from '../../shared/control';
import type { ListDesignsQuery } from '../../shared/api/designs';
import { PAGE_SIZES, type Page } from '../../shared/api/paging';
import { apiDownload, apiPage, apiRequest, type DownloadedFile, type DownloadProgress } from './client';
import type { DesignDetail, DesignSummary } from './types';

/** Filters, order and page of the designs list (every field optional). */
export type DesignListQuery = Partial<ListDesignsQuery>;

/**
 * Lists one page of designs with their latest revision and release.
 * @param query - name part, latest status, one id, order, page (default: first page by name).
 * @returns the page with the number of matching designs.
 */
export function listDesigns(query: DesignListQuery = {}): Promise<Page<DesignSummary>> {
  const { limit = PAGE_SIZES.designs.default, offset = 0, ...filters } = query;
  return apiPage<DesignSummary>('/api/designs', filters, { limit, offset });
}

function unwrap(body: DesignDetail | { design: DesignDetail }): DesignDetail {
  const inner = (body as { design: unknown }).design as { format?: unknown } | undefined;
  // `{ design: DesignDetail }` wraps; a DesignDetail itself has `design.format`.
  return inner && inner.format === undefined ? (body as { design: DesignDetail }).design : (body as DesignDetail);
}

/**
 * Creates a design from a design file.
 * @param design - the `varsmith-design/1` content.
 * @returns the created working copy.
 */
export async function createDesign(design: DesignInput): Promise<DesignDetail> {
  return unwrap(await apiRequest<DesignDetail>('POST', '/api/designs', { design }));
}

/**
 * Loads a working copy.
 * @param id - design id.
 * @returns the working copy with its version.
 */
export async function getDesign(id: string | number): Promise<DesignDetail> {
  return unwrap(await apiRequest<DesignDetail>('GET', `/api/designs/${encodeURIComponent(String(id))}`));
}

/**
 * Saves a working copy; the server answers 409 when `baseVersion` is stale.
 * @param id - design id.
 * @param design - the new content.
 * @param baseVersion - the version the edit started from.
 * @returns the saved working copy with its new version.
 */
export async function saveDesign(id: string | number, design: DesignInput, baseVersion: number): Promise<DesignDetail> {
  return unwrap(await apiRequest<DesignDetail>('PUT', `/api/designs/${encodeURIComponent(String(id))}`, { design, baseVersion }));
}

/**
 * Builds and downloads a draft bundle of the saved working copy.
 * @param id - design id.
 * @param onProgress - download progress.
 * @returns the zip file.
 */
export function downloadDraftBundle(id: string | number, onProgress?: (progress: DownloadProgress) => void): Promise<DownloadedFile> {
  return apiDownload('POST', `/api/designs/${encodeURIComponent(String(id))}/draft-bundle`, {}, onProgress);
}
