// Loads what a design is shown with.
import { findUser } from '../users/repository';
import { findRevision, latestRevision } from '../revisions/repository';
import { listReleaseRows } from '../releases/repository';
import type { DesignRelations } from './presenter';
import type { DesignRow } from './repository';

/**
 * Owner, latest revision (with author) and latest release (with its revision number).
 * @param row - the design.
 * @returns the relations.
 */
export async function relationsOf(row: DesignRow): Promise<DesignRelations> {
  const rev = await latestRevision(row.id);
  const [rel] = await listReleaseRows({ designId: row.id });
  return {
    owner: await findUser(row.ownerId),
    latestRevision: rev ? { row: rev, author: await findUser(rev.authorId) } : null,
    latestRelease: rel ? { row: rel, revisionNumber: (await findRevision(rel.revisionId))?.number ?? 0 } : null,
  };
}
