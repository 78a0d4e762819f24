// Serialises releases.
import type { ReleaseSummary } from '../../shared/api/designs';
import type { Release } from '../../shared/api/releases';
import type { PersonRow } from '../users/repository';
import { presentPerson } from '../users/presenter';
import type { ReleaseRow } from './repository';

/**
 * Full form.
 * @param row - the release.
 * @param ctx - names and people it refers to.
 * @param ctx.designName - the design's name.
 * @param ctx.revisionNumber - the revision number.
 * @param ctx.releasedBy - who released.
 * @param ctx.withdrawnBy - who withdrew, if anyone.
 * @returns the DTO.
 */
export function presentRelease(row: ReleaseRow, ctx: { designName: string; revisionNumber: number; releasedBy: PersonRow | null; withdrawnBy: PersonRow | null }): Release {
  return {
    id: row.id, designId: row.designId, designName: ctx.designName, revisionId: row.revisionId, revisionNumber: ctx.revisionNumber,
    version: row.version, fileName: row.fileName, sizeBytes: row.sizeBytes, sha256: row.sha256, releasedBy: presentPerson(ctx.releasedBy),
    createdAt: row.createdAt.toISOString(), withdrawnAt: row.withdrawnAt ? row.withdrawnAt.toISOString() : null,
    withdrawnReason: row.withdrawnReason, withdrawnBy: row.withdrawnById === null ? null : presentPerson(ctx.withdrawnBy),
  };
}

/**
 * Short form.
 * @param row - the release.
 * @param revisionNumber - its revision number.
 * @returns the DTO.
 */
export function presentReleaseSummary(row: ReleaseRow, revisionNumber: number): ReleaseSummary {
  return { id: row.id, version: row.version, revisionNumber, createdAt: row.createdAt.toISOString(), withdrawnAt: row.withdrawnAt ? row.withdrawnAt.toISOString() : null };
}
