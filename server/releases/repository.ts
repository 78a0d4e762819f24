// Release storage; returns plain objects. Bytes are read only by `releaseBytes`.
import { literal, Op, QueryTypes, type Transaction } from 'sequelize';
import type { PageRequest } from '../../shared/api/paging';
import { lockFor } from '../db/connection';
import { containsPattern, rowsByIds } from '../db/filters';
import type { PersonRow } from '../users/repository';
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

/** A release as the list shows it: the row with the design name, revision number and people it names. */
export interface ReleaseListRow extends ReleaseRow {
  designName: string;
  revisionNumber: number;
  releasedBy: PersonRow | null;
  withdrawnBy: PersonRow | null;
}

// The list page in one statement: the release columns (never `bundle`) joined to the names they refer to.
// `{releases}` is the table, on SQLite through its covering index (migration list-indexes: reading the
// columns stored after the bundle would walk the bundle's pages; the planner would scan the table).
const LIST_SELECT = `SELECT r.id, r.design_id AS "designId", d.name AS "designName", r.revision_id AS "revisionId",
  v.number AS "revisionNumber", r.version, r.file_name AS "fileName", r.sha256, r.size_bytes AS "sizeBytes",
  r.released_by_id AS "releasedById", u.name AS "releasedByName", u.email AS "releasedByEmail", r.created_at AS "createdAt",
  r.withdrawn_at AS "withdrawnAt", r.withdrawn_reason AS "withdrawnReason", r.withdrawn_by_id AS "withdrawnById",
  w.name AS "withdrawnByName", w.email AS "withdrawnByEmail"
FROM {releases} JOIN designs d ON d.id = r.design_id JOIN revisions v ON v.id = r.revision_id
LEFT JOIN users u ON u.id = r.released_by_id LEFT JOIN users w ON w.id = r.withdrawn_by_id`;

/** SQLite hands dates of raw queries back as text (`2026-12-02 14:00:00.123 +00:00`), PostgreSQL as Date. */
const toDate = (v: unknown): Date => (v instanceof Date ? v : new Date(String(v)));
const person = (id: unknown, name: unknown, email: unknown): PersonRow | null =>
  (name === null || name === undefined ? null : { id: Number(id), name: String(name), email: String(email) });

/**
 * One page of releases with the names they refer to (never their bytes), newest first, and how many
 * match: two statements (the page, the count) whatever the page size.
 * @param filter - design, version and text filters.
 * @param page - limit and offset.
 * @returns the rows of the page and the total.
 */
export async function listReleaseRows(filter: ReleaseFilter, page: PageRequest): Promise<{ rows: ReleaseListRow[]; total: number }> {
  const sequelize = ReleaseModel.sequelize!;
  const where: string[] = [];
  const replacements: Record<string, unknown> = { limit: page.limit, offset: page.offset };
  if (filter.designId !== undefined) {
    where.push('r.design_id = :designId');
    replacements.designId = filter.designId;
  }
  if (filter.version !== undefined) {
    where.push('r.version = :version');
    replacements.version = filter.version;
  }
  if (filter.q) {
    where.push('(lower(d.name) LIKE :pattern OR lower(r.version) LIKE :pattern)');
    replacements.pattern = containsPattern(filter.q);
  }
  const clause = where.length > 0 ? ` WHERE ${where.join(' AND ')}` : '';
  const releases = sequelize.getDialect() === 'sqlite' ? 'releases r INDEXED BY releases_listing' : 'releases r';
  const countFrom = filter.q ? 'releases r JOIN designs d ON d.id = r.design_id' : 'releases r';
  const [rows, counted] = await Promise.all([
    sequelize.query<Record<string, unknown>>(`${LIST_SELECT.replace('{releases}', releases)}${clause} ORDER BY r.id DESC LIMIT :limit OFFSET :offset`, { replacements, type: QueryTypes.SELECT }),
    sequelize.query<{ total: unknown }>(`SELECT COUNT(*) AS total FROM ${countFrom}${clause}`, { replacements, type: QueryTypes.SELECT }),
  ]);
  return {
    total: Number(counted[0].total),
    rows: rows.map((x) => ({
      id: Number(x.id), designId: Number(x.designId), designName: String(x.designName), revisionId: Number(x.revisionId),
      revisionNumber: Number(x.revisionNumber), version: String(x.version), fileName: String(x.fileName), sha256: String(x.sha256),
      sizeBytes: Number(x.sizeBytes), releasedById: Number(x.releasedById), releasedBy: person(x.releasedById, x.releasedByName, x.releasedByEmail),
      createdAt: toDate(x.createdAt), withdrawnAt: x.withdrawnAt === null ? null : toDate(x.withdrawnAt),
      withdrawnReason: x.withdrawnReason === null ? null : String(x.withdrawnReason),
      withdrawnById: x.withdrawnById === null ? null : Number(x.withdrawnById), withdrawnBy: person(x.withdrawnById, x.withdrawnByName, x.withdrawnByEmail),
    })),
  };
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
 * Design and version of releases by id, in one query.
 * @param ids - release ids (one page of rows' worth).
 * @returns what was found, by id.
 */
export async function releaseVersions(ids: readonly number[]): Promise<Map<number, { designId: number; version: string }>> {
  const rows = await rowsByIds(ReleaseModel, ids, ['id', 'designId', 'version']);
  return new Map(rows.map((m) => [m.id, { designId: m.designId, version: m.version }]));
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
