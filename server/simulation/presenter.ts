// The JSON shape of a stored revision run.
import type { RevisionRun } from '../../shared/api/simulation';
import type { RevisionRunRow } from './repository';

/**
 * Presents a stored run.
 * @param row - the row.
 * @returns the DTO.
 */
export function presentRevisionRun(row: RevisionRunRow): RevisionRun {
  return {
    revisionId: row.revisionId,
    scenario: row.scenario,
    model: row.model,
    harmonicTable: row.harmonicTable,
    coefficients: row.coefficients,
    toolVersion: row.toolVersion,
    computedAt: row.createdAt.toISOString(),
    result: row.result,
  };
}
