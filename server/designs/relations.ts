// Loads what designs are shown with, for a whole page of rows in a fixed number of queries.
import { peopleByIds } from '../users/repository';
import { latestRevisionSummaries, revisionNumbers } from '../revisions/repository';
import { latestReleases } from '../releases/repository';
import type { DesignRelations } from './presenter';
import type { DesignListRow } from './repository';

/**
 * Owner, latest revision (with author) and latest release (with its revision number) of each design:
 * four queries whatever the number of rows.
 * @param rows - the designs (one page).
 * @returns the relations, in the order of `rows`.
 */
export async function relationsOfAll(rows: readonly DesignListRow[]): Promise<DesignRelations[]> {
  const ids = rows.map((r) => r.id);
  const [revisions, releases] = await Promise.all([latestRevisionSummaries(ids), latestReleases(ids)]);
  const [people, numbers] = await Promise.all([
    peopleByIds([...rows.map((r) => r.ownerId), ...[...revisions.values()].map((r) => r.authorId)]),
    revisionNumbers([...releases.values()].map((r) => r.revisionId)),
  ]);
  return rows.map((row) => {
    const rev = revisions.get(row.id);
    const rel = releases.get(row.id);
    return {
      owner: people.get(row.ownerId) ?? null,
      latestRevision: rev ? { row: rev, author: people.get(rev.authorId) ?? null } : null,
      latestRelease: rel ? { row: rel, revisionNumber: numbers.get(rel.revisionId) ?? 0 } : null,
    };
  });
}

/**
 * Owner, latest revision and latest release of one design.
 * @param row - the design.
 * @returns the relations.
 */
export async function relationsOf(row: DesignListRow): Promise<DesignRelations> {
  return (await relationsOfAll([row]))[0];
}
