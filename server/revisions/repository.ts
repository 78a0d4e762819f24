// Revision storage; returns plain objects. Full rows carry the frozen design and analysis parsed;
// list rows (`RevisionSummaryRow`) never read those two texts.
import { literal, Op, type Transaction } from 'sequelize';
import type { RevisionStatus } from '../../shared/api/designs';
import type { PageRequest } from '../../shared/api/paging';
import type { AnalysisResult, DesignInput } from '../../shared/control';
import { lockFor } from '../db/connection';
import { rowsByIds } from '../db/filters';
import { RevisionModel } from './model';

/** A revision row. */
export interface RevisionRow {
  id: number;
  designId: number;
  number: number;
  authorId: number;
  summary: string;
  status: RevisionStatus;
  design: DesignInput;
  analysis: AnalysisResult;
  errorCount: number;
  warningCount: number;
  createdAt: Date;
}

/** A revision as lists show it: no frozen design, no analysis. */
export type RevisionSummaryRow = Omit<RevisionRow, 'design' | 'analysis'>;

const SUMMARY_ATTRIBUTES = ['id', 'designId', 'number', 'authorId', 'summary', 'status', 'errorCount', 'warningCount', 'createdAt'] as const;

const summary = (m: RevisionModel): RevisionSummaryRow => ({
  id: m.id, designId: m.designId, number: m.number, authorId: m.authorId, summary: m.summary, status: m.status,
  errorCount: m.errorCount, warningCount: m.warningCount, createdAt: m.createdAt,
});
const plain = (m: RevisionModel): RevisionRow => ({
  ...summary(m), design: JSON.parse(m.design) as DesignInput, analysis: JSON.parse(m.analysis) as AnalysisResult,
});

/**
 * Finds a revision.
 * @param id - revision id.
 * @param transaction - optional transaction.
 * @returns the row or null.
 */
export async function findRevision(id: number, transaction?: Transaction): Promise<RevisionRow | null> {
  const m = await RevisionModel.findByPk(id, { transaction });
  return m ? plain(m) : null;
}

/**
 * Reads a revision and locks its row until the transaction ends (a decision on its status).
 * @param id - revision id.
 * @param transaction - the write transaction.
 * @returns the row or null.
 */
export async function lockRevision(id: number, transaction: Transaction): Promise<RevisionRow | null> {
  const m = await RevisionModel.findByPk(id, lockFor(transaction));
  return m ? plain(m) : null;
}

/**
 * One page of the revisions of a design, newest first (index revisions_design_number), and how many there are.
 * @param designId - design id.
 * @param page - limit and offset, and optionally only numbers below `before`.
 * @returns the rows of the page and the total.
 */
export async function listRevisionSummaries(designId: number, page: PageRequest & { before?: number }): Promise<{ rows: RevisionSummaryRow[]; total: number }> {
  const where = page.before === undefined ? { designId } : { designId, number: { [Op.lt]: page.before } };
  const [total, rows] = await Promise.all([
    RevisionModel.count({ where }),
    RevisionModel.findAll({ where, attributes: [...SUMMARY_ATTRIBUTES], order: [['number', 'DESC']], limit: page.limit, offset: page.offset }),
  ]);
  return { rows: rows.map(summary), total };
}

/**
 * The newest revision of each design, in one query.
 * @param designIds - design ids (one page of rows' worth).
 * @returns the revisions found, by design id.
 */
export async function latestRevisionSummaries(designIds: readonly number[]): Promise<Map<number, RevisionSummaryRow>> {
  const unique = [...new Set(designIds)];
  if (unique.length === 0) return new Map();
  const rows = await RevisionModel.findAll({
    where: { designId: unique, number: { [Op.eq]: literal('(SELECT MAX(r2.number) FROM revisions r2 WHERE r2.design_id = "Revision"."design_id")') } },
    attributes: [...SUMMARY_ATTRIBUTES],
  });
  return new Map(rows.map((m) => [m.designId, summary(m)]));
}

/**
 * Revision numbers by revision id, in one query.
 * @param ids - revision ids (one page of rows' worth).
 * @returns the numbers found, by id.
 */
export async function revisionNumbers(ids: readonly number[]): Promise<Map<number, number>> {
  return new Map((await rowsByIds(RevisionModel, ids, ['id', 'number'])).map((m) => [m.id, m.number]));
}

/**
 * The highest revision number of a design (0 when none).
 * @param designId - design id.
 * @param transaction - the write transaction.
 * @returns the number.
 */
export async function maxRevisionNumber(designId: number, transaction: Transaction): Promise<number> {
  const n = (await RevisionModel.max('number', { where: { designId }, transaction })) as number | null;
  return n ?? 0;
}

/**
 * Inserts a revision.
 * @param data - the frozen revision.
 * @param transaction - the write transaction.
 * @returns the row.
 */
export async function insertRevision(data: Omit<RevisionRow, 'id' | 'createdAt'>, transaction: Transaction): Promise<RevisionRow> {
  const m = await RevisionModel.create({ ...data, design: JSON.stringify(data.design), analysis: JSON.stringify(data.analysis) }, { transaction });
  return plain(m);
}

/**
 * Sets the status of a revision (the only field that ever changes).
 * @param id - revision id.
 * @param status - new status.
 * @param transaction - the write transaction.
 */
export async function setRevisionStatus(id: number, status: RevisionStatus, transaction: Transaction): Promise<void> {
  await RevisionModel.update({ status }, { where: { id }, transaction });
}

/**
 * Open (in review or approved, not released) revisions of a design older than `number`, locked until the transaction ends.
 * @param designId - design id.
 * @param number - the new revision number.
 * @param transaction - the write transaction.
 * @returns ids and numbers.
 */
export async function openRevisionsBefore(designId: number, number: number, transaction: Transaction): Promise<{ id: number; number: number }[]> {
  // Locked, so a decision committed meanwhile in another process is seen before superseding.
  const rows = await RevisionModel.findAll({ where: { designId, number: { [Op.lt]: number }, status: ['in-review', 'approved'] }, attributes: ['id', 'number'], ...lockFor(transaction) });
  return rows.map((r) => ({ id: r.id, number: r.number }));
}
