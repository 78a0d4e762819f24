// Released sets (CONTRACT section 6: /api/revisions/:id/release, /api/releases).
import { PAGE_SIZES, type Page } from '../../shared/api/paging';
import type { ListReleasesQuery, Release } from '../../shared/api/releases';
import { apiDownload, apiPage, apiRequest, apiText, type DownloadedFile, type DownloadProgress } from './client';

function idPart(id: string | number): string {
  return encodeURIComponent(String(id));
}

function unwrapRelease(body: Release | { release: Release }): Release {
  return 'release' in body ? body.release : body;
}

/**
 * Lists one page of released sets, newest first, optionally filtered.
 * @param query - design name, design id, version, part of name or version; page (default: the first).
 * @returns the page with the number of matching releases.
 */
export function listReleases(query: Partial<ListReleasesQuery> = {}): Promise<Page<Release>> {
  const { limit = PAGE_SIZES.releases.default, offset = 0, ...filters } = query;
  return apiPage<Release>('/api/releases', filters, { limit, offset });
}

/**
 * Loads one release.
 * @param id - release id.
 * @returns the release.
 */
export async function getRelease(id: string | number): Promise<Release> {
  return unwrapRelease(await apiRequest<Release | { release: Release }>('GET', `/api/releases/${idPart(id)}`));
}

/**
 * Releases an approved revision under a semantic version (engineer or admin).
 * @param revisionId - the approved revision.
 * @param version - semver, unique per design.
 * @returns the stored release.
 */
export async function createRelease(revisionId: string | number, version: string): Promise<Release> {
  return unwrapRelease(await apiRequest<Release | { release: Release }>('POST', `/api/revisions/${idPart(revisionId)}/release`, { version }));
}

/**
 * Downloads the stored bundle bytes of a release.
 * @param id - release id.
 * @param onProgress - download progress.
 * @returns the zip file.
 */
export function downloadReleaseBundle(id: string | number, onProgress?: (progress: DownloadProgress) => void): Promise<DownloadedFile> {
  return apiDownload('GET', `/api/releases/${idPart(id)}/bundle`, undefined, onProgress);
}

/**
 * Withdraws a release with a reason (engineer or admin); it stays listed and downloadable, marked.
 * @param id - release id.
 * @param reason - why, kept with the release.
 * @returns the release after the change.
 */
export async function withdrawRelease(id: string | number, reason: string): Promise<Release> {
  return unwrapRelease(await apiRequest<Release | { release: Release }>('POST', `/api/releases/${idPart(id)}/withdraw`, { reason }));
}

/**
 * The report of a released set (REPORT.md from its stored bundle).
 * @param id - release id.
 * @returns the Markdown text.
 */
export function getReleaseReport(id: string | number): Promise<string> {
  return apiText(`/api/releases/${idPart(id)}/report`);
}

/**
 * A plain download of a release's bundle with curl and a bench token, then a SHA-256 check
 * (no Varsmith command needed; curl and sha256sum from coreutils).
 * @param origin - the server address as the browser sees it.
 * @param release - the release.
 * @param token - a read-only token, or a placeholder to replace.
 * @returns two lines: the download and the check.
 */
export function curlCommand(origin: string, release: Pick<Release, 'id' | 'fileName' | 'sha256'>, token = '<token>'): string {
  const file = release.fileName.endsWith('.zip') ? release.fileName : `${release.fileName}.zip`;
  return `curl -fSL -H "Authorization: Bearer ${token}" -o ${shellQuote(file)} ${origin}/api/releases/${release.id}/bundle
`
    + `echo ${shellQuote(`${release.sha256}  ${file}`)} | sha256sum -c -`;
}

/**
 * The command a bench or CI job runs to fetch and verify this release (CONTRACT section 4).
 * @param origin - the server address as the browser sees it (e.g. `https://varsmith.lab:8443`).
 * @param release - the release.
 * @param token - a read-only token, or a placeholder to replace.
 * @returns the `npx varsmith pull …` line.
 */
export function pullCommand(origin: string, release: Pick<Release, 'designName' | 'version' | 'fileName'>, token = '<token>'): string {
  const file = release.fileName.endsWith('.zip') ? release.fileName : `${release.fileName}.zip`;
  return `npx varsmith pull --server ${origin} --token ${token} --design ${shellQuote(release.designName)} --set-version ${release.version} -o ${shellQuote(file)}`;
}

/**
 * Quotes a word for a POSIX shell when it holds anything beyond safe characters.
 * @param word - the word.
 * @returns the word, single-quoted when needed.
 */
export function shellQuote(word: string): string {
  if (/^[A-Za-z0-9_@%+=:,./-]+$/.test(word)) return word;
  return `'${word.replace(/'/g, `'\\''`)}'`;
}
