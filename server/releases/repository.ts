// Release storage; returns plain objects. Bytes are read only by `releaseBytes`.
import { literal, Op, type Transaction, type WhereOptions } from 'sequelize';
import type { PageRequest } from '../../shared/api/paging';
import { lockFor } from '../db/connection';
import { containsPattern, textContains } from '../db/filters';
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

/** Filters of the releases list. */
export interface ReleaseFilter {
  designId?: number;
  version?: string;
  /** Case-insensitive part of the design name or of the version. */
  q?: string;
}

/**
 * One page of releases (never their bytes), newest first, and how many match.
 * @param filter - design, version and text filters.
 * @param page - limit and offset.
 * @returns the rows of the page and the total.
 */
export async function listReleaseRows(filter: ReleaseFilter, page: PageRequest): Promise<{ rows: ReleaseRow[]; total: number }> {
  const conditions: WhereOptions[] = [];
  if (filter.designId !== undefined) conditions.push({ designId: filter.designId });
  if (filter.version !== undefined) conditions.push({ version: filter.version });
  if (filter.q) {
    const pattern = ReleaseModel.sequelize!.escape(containsPattern(filter.q));
    const designIds = literal(`(SELECT d.id FROM designs d WHERE lower(d.name) LIKE ${pattern})`);
    conditions.push({ [Op.or]: [textContains('Release.version', filter.q), { designId: { [Op.in]: designIds } }] });
  }
  const where: WhereOptions = conditions.length > 0 ? { [Op.and]: conditions } : {};
  const [total, rows] = await Promise.all([
    ReleaseModel.count({ where }),
    ReleaseModel.findAll({ where, attributes: [...META], order: [['id', 'DESC']], limit: page.limit, offset: page.offset }),
  ]);
  return { rows: rows.map(plain), total };
}

/**
 * The newest release of each design, in one query.
 * @param designIds - design ids (one page of rows' worth).
 * @returns the releases found, by design id.
 */
export async function latestReleases(designIds: readonly number[]): Promise<Map<number, ReleaseRow>> {
  const unique = [...new Set(designIds)];
  if (unique.length === 0) return new Map();
  const rows = await ReleaseModel.findAll({
    where: { designId: unique, id: { [Op.eq]: literal('(SELECT MAX(r2.id) FROM releases r2 WHERE r2.design_id = "Release"."design_id")') } },
    attributes: [...META],
  });
  return new Map(rows.map((m) => [m.designId, plain(m)]));
}

/**
 * The release of a revision (at most one: `revision_id` is unique).
 * @param revisionId - revision id.
 * @returns the row or null.
 */
export async function findReleaseOfRevision(revisionId: number): Promise<ReleaseRow | null> {
  const m = await ReleaseModel.findOne({ where: { revisionId }, attributes: [...META] });
  return m ? plain(m) : null;
}

/**
 * Reads a release and locks its row until the transaction ends (withdrawal decided on what it read).
 * @param id - release id.
 * @param transaction - the write transaction.
 * @returns the row or null.
 */
export async function lockRelease(id: number, transaction: Transaction): Promise<ReleaseRow | null> {
  const m = await ReleaseModel.findByPk(id, { attributes: [...META], ...lockFor(transaction) });
  return m ? plain(m) : null;
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
