// Names for the targets of audit entries, so the log reads "SC-3 bench unit r2" and not
// "revision #7". A page of entries is named in a fixed number of queries (one per kind of target).
import { designNames } from '../designs/repository';
import { releaseVersions } from '../releases/repository';
import { tokenNames } from '../tokens/repository';
import { peopleByIds } from '../users/repository';
import type { AuditRow } from './repository';

const key = (row: Pick<AuditRow, 'targetType' | 'targetId'>): string => `${row.targetType}:${row.targetId}`;

/**
 * The readable name of every distinct target among `rows`.
 * @param rows - audit rows (one page: at most the audit route's largest page, 1000).
 * @returns names by `targetType:targetId`; a target that no longer resolves is left out.
 */
export async function targetLabels(rows: readonly AuditRow[]): Promise<Map<string, string>> {
  const idsOf = (type: string) => rows.filter((r) => r.targetType === type && r.targetId !== null).map((r) => r.targetId as number);
  const releases = await releaseVersions(idsOf('release'));
  const revisionDesigns = rows.filter((r) => r.targetType === 'revision' && typeof r.details.designId === 'number').map((r) => r.details.designId as number);
  const [names, people, tokens] = await Promise.all([
    designNames([...idsOf('design'), ...revisionDesigns, ...[...releases.values()].map((r) => r.designId)]),
    peopleByIds(idsOf('user')),
    tokenNames(idsOf('token')),
  ]);
  const labels = new Map<string, string>();
  for (const row of rows) {
    if (row.targetId === null) continue;
    const label = labelOf(row, row.targetId, { names, people, tokens, releases });
    if (label !== null) labels.set(key(row), label);
  }
  return labels;
}

function labelOf(
  row: AuditRow, id: number,
  found: { names: Map<number, string>; people: Map<number, { email: string }>; tokens: Map<number, string>; releases: Map<number, { designId: number; version: string }> },
): string | null {
  const d = row.details;
  switch (row.targetType) {
    case 'design':
      return found.names.get(id) ?? null;
    case 'revision': {
      if (typeof d.designId !== 'number' || typeof d.number !== 'number') return null;
      const name = found.names.get(d.designId);
      return name === undefined ? null : `${name} r${d.number}`;
    }
    case 'release': {
      const release = found.releases.get(id);
      const name = release && found.names.get(release.designId);
      return release && name !== undefined ? `${name} ${release.version}` : null;
    }
    case 'user':
      return found.people.get(id)?.email ?? null;
    case 'token': {
      const name = found.tokens.get(id);
      return name === undefined ? null : `token “${name}”`;
    }
    default:
      return null;
  }
}

/**
 * The name of one entry's target.
 * @param labels - names from `targetLabels`.
 * @param row - the entry.
 * @returns the name, or null.
 */
export function targetLabelOf(labels: Map<string, string>, row: AuditRow): string | null {
  return row.targetId === null ? null : labels.get(key(row)) ?? null;
}
