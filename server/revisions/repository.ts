// Revision storage; returns plain objects with design and analysis parsed.
import { Op, type Transaction } from 'sequelize';
import type { RevisionStatus } from '../../shared/api/designs';
import type { AnalysisResult, DesignInput } from '../../shared/control';
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

const plain = (m: RevisionModel): RevisionRow => ({
  id: m.id, designId: m.designId, number: m.number, authorId: m.authorId, summary: m.summary, status: m.status,
  design: JSON.parse(m.design) as DesignInput, analysis: JSON.parse(m.analysis) as AnalysisResult,
  errorCount: m.errorCount, warningCount: m.warningCount, createdAt: m.createdAt,
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
 * Lists the revisions of a design, newest first.
 * @param designId - design id.
 * @returns the rows.
 */
export async function listRevisionRows(designId: number): Promise<RevisionRow[]> {
  return (await RevisionModel.findAll({ where: { designId }, order: [['number', 'DESC']] })).map(plain);
}

/**
 * The newest revision of a design.
 * @param designId - design id.
 * @returns the row or null.
 */
export async function latestRevision(designId: number): Promise<RevisionRow | null> {
  const m = await RevisionModel.findOne({ where: { designId }, order: [['number', 'DESC']] });
  return m ? plain(m) : null;
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
 * Open (in review or approved, not released) revisions of a design older than `number`.
 * @param designId - design id.
 * @param number - the new revision number.
 * @param transaction - the write transaction.
 * @returns ids and numbers.
 */
export async function openRevisionsBefore(designId: number, number: number, transaction: Transaction): Promise<{ id: number; number: number }[]> {
  const rows = await RevisionModel.findAll({ where: { designId, number: { [Op.lt]: number }, status: ['in-review', 'approved'] }, attributes: ['id', 'number'], transaction });
  return rows.map((r) => ({ id: r.id, number: r.number }));
}
