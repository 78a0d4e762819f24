// Names for the targets of audit entries, so the log reads "SC-3 bench unit r2" and not
// "revision #7". Looked up once per distinct target of a page of entries.
import { findDesign } from '../designs/repository';
import { findRelease } from '../releases/repository';
import { findToken } from '../tokens/repository';
import { findUser } from '../users/repository';
import type { AuditRow } from './repository';

const key = (row: Pick<AuditRow, 'targetType' | 'targetId'>): string => `${row.targetType}:${row.targetId}`;

/**
 * The readable name of every distinct target among `rows`.
 * @param rows - audit rows (at most the query limit of the audit route, 1000).
 * @returns names by `targetType:targetId`; a target that no longer resolves is left out.
 */
export async function targetLabels(rows: readonly AuditRow[]): Promise<Map<string, string>> {
  const designNames = new Map<number, string | null>();
  const designName = async (id: number): Promise<string | null> => {
    if (!designNames.has(id)) designNames.set(id, (await findDesign(id))?.name ?? null);
    return designNames.get(id) ?? null;
  };
  const labels = new Map<string, string>();
  for (const row of rows) {
    if (row.targetId === null || labels.has(key(row))) continue;
    const label = await labelOf(row, designName);
    if (label !== null) labels.set(key(row), label);
  }
  return labels;
}

async function labelOf(row: AuditRow, designName: (id: number) => Promise<string | null>): Promise<string | null> {
  const id = row.targetId as number;
  const d = row.details;
  switch (row.targetType) {
    case 'design':
      return designName(id);
    case 'revision': {
      if (typeof d.designId !== 'number' || typeof d.number !== 'number') return null;
      const name = await designName(d.designId);
      return name === null ? null : `${name} r${d.number}`;
    }
    case 'release': {
      const release = await findRelease(id);
      if (!release) return null;
      const name = await designName(release.designId);
      return name === null ? null : `${name} ${release.version}`;
    }
    case 'user':
      return (await findUser(id))?.email ?? null;
    case 'token': {
      const token = await findToken(id);
      return token ? `token “${token.name}”` : null;
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
