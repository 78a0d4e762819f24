// Invented data for client tests (no real units, companies or people), shaped by the shared DTOs.
import type { DesignDetail, ReleaseSummary, RevisionSummary } from '../../src/api/types';
import { newDesignTemplate } from '../../src/stores/designs';

/**
 * A revision row.
 * @param overrides - fields to replace.
 * @returns the revision summary.
 */
export function buildRevisionSummary(overrides: Partial<RevisionSummary> = {}): RevisionSummary {
  return {
    id: 10, designId: 7, number: 1, status: 'in-review', summary: 'First set', createdAt: '2026-11-30T09:00:00.000Z',
    author: { id: 1, name: 'Ena Engineer', email: 'engineer@varsmith.test' }, errorCount: 0, warningCount: 1,
    ...overrides,
  };
}

/**
 * A release row.
 * @param overrides - fields to replace.
 * @returns the release summary.
 */
export function buildReleaseSummary(overrides: Partial<ReleaseSummary> = {}): ReleaseSummary {
  return { id: 3, version: '1.0.0', revisionNumber: 1, createdAt: '2026-11-30T12:00:00.000Z', withdrawnAt: null, ...overrides };
}

/**
 * A working copy as the API returns it.
 * @param overrides - fields to replace.
 * @returns the detail.
 */
export function buildDesignDetail(overrides: Partial<DesignDetail> = {}): DesignDetail {
  return {
    id: 7,
    name: 'Bay 4 rig',
    owner: { id: 1, name: 'Ena Engineer', email: 'engineer@varsmith.test' },
    createdAt: '2026-11-29T08:00:00.000Z',
    updatedAt: '2026-11-30T10:00:00.000Z',
    version: 3,
    latestRevision: null,
    latestRelease: null,
    design: newDesignTemplate('Bay 4 rig'),
    ...overrides,
  };
}
