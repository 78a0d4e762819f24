// Invented data for client tests (no real units, companies or people).
import type { DesignDetail } from '../../src/api/types';
import { newDesignTemplate } from '../../src/stores/designs';

/**
 * A working copy as the API returns it.
 * @param overrides - fields to replace.
 * @returns the detail.
 */
export function buildDesignDetail(overrides: Partial<DesignDetail> = {}): DesignDetail {
  return {
    id: 7,
    name: 'Bay 4 rig',
    owner: { id: 1, name: 'Ena Engineer' },
    updatedAt: '2026-11-30T10:00:00.000Z',
    version: 3,
    latestRevision: null,
    latestRelease: null,
    design: newDesignTemplate('Bay 4 rig'),
    ...overrides,
  };
}
