// Release storage; returns plain objects. Bytes are read only by `releaseBytes`.
import type { Transaction } from 'sequelize';
import { ReleaseModel } from './model';

/** A release row without its bytes. */
export interface ReleaseRow {
  id: number;
  designId: number;
  revisionId: number;
  version: string;
  fileName: string;
  sha256: string;
  sizeBytes: number;
  releasedById: number;
  createdAt: Date;
  withdrawnAt: Date | null;
  withdrawnReason: string | null;
  withdrawnById: number | null;
}

const META = ['id', 'designId', 'revisionId', 'version', 'fileName', 'sha256', 'sizeBytes', 'releasedById', 'createdAt', 'withdrawnAt', 'withdrawnReason', 'withdrawnById'] as const;
const plain = (m: ReleaseModel): ReleaseRow => ({
  id: m.id, designId: m.designId, revisionId: m.revisionId, version: m.version, fileName: m.fileName, sha256: m.sha256, sizeBytes: m.sizeBytes,
  releasedById: m.releasedById, createdAt: m.createdAt, withdrawnAt: m.withdrawnAt ?? null, withdrawnReason: m.withdrawnReason ?? null, withdrawnById: m.withdrawnById ?? null,
});

/**
 * Lists releases, newest first.
 * @param where - optional design and version filters.
 * @returns the rows.
 */
export async function listReleaseRows(where: { designId?: number; version?: string } = {}): Promise<ReleaseRow[]> {
  const w: Record<string, unknown> = {};
  if (where.designId !== undefined) w.designId = where.designId;
  if (where.version !== undefined) w.version = where.version;
  return (await ReleaseModel.findAll({ where: w, attributes: [...META], order: [['id', 'DESC']] })).map(plain);
}

/**
 * Finds a release.
 * @param id - release id.
 * @param transaction - optional transaction.
 * @returns the row or null.
 */
export async function findRelease(id: number, transaction?: Transaction): Promise<ReleaseRow | null> {
  const m = await ReleaseModel.findByPk(id, { attributes: [...META], transaction });
  return m ? plain(m) : null;
}

/**
 * Finds the release of a design under a version.
 * @param designId - design id.
 * @param version - semver.
 * @param transaction - optional transaction.
 * @returns the row or null.
 */
export async function findReleaseByVersion(designId: number, version: string, transaction?: Transaction): Promise<ReleaseRow | null> {
  const m = await ReleaseModel.findOne({ where: { designId, version }, attributes: [...META], transaction });
  return m ? plain(m) : null;
}

/**
 * The bundle bytes of a release.
 * @param id - release id.
 * @returns the bytes or null.
 */
export async function releaseBytes(id: number): Promise<Buffer | null> {
  const m = await ReleaseModel.findByPk(id, { attributes: ['bundle'] });
  return m ? Buffer.from(m.bundle) : null;
}

/**
 * Stores a release with its bytes.
 * @param data - fields and bytes.
 * @param transaction - the write transaction.
 * @returns the row.
 */
export async function insertRelease(data: Omit<ReleaseRow, 'id' | 'createdAt' | 'withdrawnAt' | 'withdrawnReason' | 'withdrawnById'> & { bundle: Buffer }, transaction: Transaction): Promise<ReleaseRow> {
  const m = await ReleaseModel.create(data, { transaction });
  return (await findRelease(m.id, transaction)) as ReleaseRow;
}

/**
 * Marks a release withdrawn (the bytes stay).
 * @param id - release id.
 * @param byId - who.
 * @param reason - why.
 * @param transaction - the write transaction.
 */
export async function markWithdrawn(id: number, byId: number, reason: string, transaction: Transaction): Promise<void> {
  await ReleaseModel.update({ withdrawnAt: new Date(), withdrawnById: byId, withdrawnReason: reason }, { where: { id }, transaction });
}
