// Serialises designs with their latest revision and release.
import type { DesignDetail, DesignSummary } from '../../shared/api/designs';
import { presentPerson } from '../users/presenter';
import { presentRevisionSummary } from '../revisions/presenter';
import { presentReleaseSummary } from '../releases/presenter';
import type { PersonRow } from '../users/repository';
import type { RevisionSummaryRow } from '../revisions/repository';
import type { ReleaseRow } from '../releases/repository';
import type { DesignListRow, DesignRow } from './repository';

/** What a design row is shown with. */
export interface DesignRelations {
  owner: PersonRow | null;
  latestRevision: { row: RevisionSummaryRow; author: PersonRow | null } | null;
  latestRelease: { row: ReleaseRow; revisionNumber: number } | null;
}

/**
 * List row.
 * @param row - the design.
 * @param rel - related rows.
 * @returns the DTO.
 */
export function presentDesignSummary(row: DesignListRow, rel: DesignRelations): DesignSummary {
  return {
    id: row.id, name: row.name, owner: presentPerson(rel.owner), version: row.version,
    createdAt: row.createdAt.toISOString(), updatedAt: row.updatedAt.toISOString(),
    latestRevision: rel.latestRevision ? presentRevisionSummary(rel.latestRevision.row, rel.latestRevision.author) : null,
    latestRelease: rel.latestRelease ? presentReleaseSummary(rel.latestRelease.row, rel.latestRelease.revisionNumber) : null,
  };
}

/**
 * Working copy.
 * @param row - the design.
 * @param rel - related rows.
 * @returns the DTO.
 */
export function presentDesignDetail(row: DesignRow, rel: DesignRelations): DesignDetail {
  return { ...presentDesignSummary(row, rel), design: row.design };
}
