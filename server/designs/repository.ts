// Design storage; returns plain objects with the working copy parsed.
import { literal, Op, type Order, type Transaction, type WhereOptions } from 'sequelize';
import type { DesignInput } from '../../shared/control';
import type { DesignSort, ListDesignsQuery } from '../../shared/api/designs';
import { lockFor } from '../db/connection';
import { rowsByIds, textContains } from '../db/filters';
import { DesignModel } from './model';

/** A design row. */
export interface DesignRow {
  id: number;
  name: string;
  ownerId: number;
  design: DesignInput;
  version: number;
  createdAt: Date;
  updatedAt: Date;
}

/** A design as lists show it: no working copy. */
export type DesignListRow = Omit<DesignRow, 'design'>;

const LIST_ATTRIBUTES = ['id', 'name', 'ownerId', 'version', 'createdAt', 'updatedAt'] as const;

const listed = (m: DesignModel): DesignListRow => ({ id: m.id, name: m.name, ownerId: m.ownerId, version: m.version, createdAt: m.createdAt, updatedAt: m.updatedAt });
const plain = (m: DesignModel): DesignRow => ({ ...listed(m), design: JSON.parse(m.content) as DesignInput });

const ORDERS: Record<DesignSort, Order> = {
  'name': [['name', 'ASC'], ['id', 'ASC']],
  '-name': [['name', 'DESC'], ['id', 'DESC']],
  'updatedAt': [['updatedAt', 'ASC'], ['id', 'ASC']],
  '-updatedAt': [['updatedAt', 'DESC'], ['id', 'DESC']],
};

/**
 * One page of designs (without their working copies) and how many match.
 * @param q - name filter, status of the latest revision, order, page.
 * @returns the rows of the page and the total.
 */
export async function listDesignRows(q: ListDesignsQuery): Promise<{ rows: DesignListRow[]; total: number }> {
  const conditions: WhereOptions[] = [];
  if (q.q) conditions.push(textContains('Design.name', q.q));
  if (q.id !== undefined) conditions.push({ id: q.id });
  if (q.status) {
    const status = DesignModel.sequelize!.escape(q.status);
    // Designs whose newest revision has the status (index revisions_design_number).
    conditions.push({ id: { [Op.in]: literal(`(SELECT r.design_id FROM revisions r WHERE r.status = ${status} AND r.number = (SELECT MAX(r2.number) FROM revisions r2 WHERE r2.design_id = r.design_id))`) } });
  }
  const where: WhereOptions = conditions.length > 0 ? { [Op.and]: conditions } : {};
  const [total, rows] = await Promise.all([
    DesignModel.count({ where }),
    DesignModel.findAll({ where, attributes: [...LIST_ATTRIBUTES], order: ORDERS[q.sort], limit: q.limit, offset: q.offset }),
  ]);
  return { rows: rows.map(listed), total };
}

/**
 * Design names by id, in one query.
 * @param ids - design ids (one page of rows' worth).
 * @returns the names found, by id.
 */
export async function designNames(ids: readonly number[]): Promise<Map<number, string>> {
  return new Map((await rowsByIds(DesignModel, ids, ['id', 'name'])).map((m) => [m.id, m.name]));
}

/**
 * Reads a design and locks its row until the transaction ends: revision numbers and release
 * versions of the design are allocated one transaction at a time, in every process.
 * @param id - design id.
 * @param transaction - the write transaction.
 * @returns the row or null.
 */
export async function lockDesign(id: number, transaction: Transaction): Promise<DesignRow | null> {
  const m = await DesignModel.findByPk(id, lockFor(transaction));
  return m ? plain(m) : null;
}

/**
 * Finds a design.
 * @param id - design id.
 * @param transaction - optional transaction.
 * @returns the row or null.
 */
export async function findDesign(id: number, transaction?: Transaction): Promise<DesignRow | null> {
  const m = await DesignModel.findByPk(id, { transaction });
  return m ? plain(m) : null;
}

/**
 * Whether a design exists (reads no working copy).
 * @param id - design id.
 * @returns true when it does.
 */
export async function designExists(id: number): Promise<boolean> {
  return (await DesignModel.findByPk(id, { attributes: ['id'] })) !== null;
}

/**
 * The id of the design with this exact name (reads no working copy).
 * @param name - design name.
 * @returns the id or null.
 */
export async function designIdByName(name: string): Promise<number | null> {
  return (await DesignModel.findOne({ where: { name }, attributes: ['id'] }))?.id ?? null;
}

/**
 * Finds a design by its exact name.
 * @param name - design name.
 * @param transaction - optional transaction.
 * @returns the row or null.
 */
export async function findDesignByName(name: string, transaction?: Transaction): Promise<DesignRow | null> {
  const m = await DesignModel.findOne({ where: { name }, transaction });
  return m ? plain(m) : null;
}

/**
 * Inserts a design at version 1.
 * @param data - name, owner, content.
 * @param transaction - the write transaction.
 * @returns the row.
 */
export async function insertDesign(data: { name: string; ownerId: number; design: DesignInput }, transaction: Transaction): Promise<DesignRow> {
  return plain(await DesignModel.create({ name: data.name, ownerId: data.ownerId, content: JSON.stringify(data.design), version: 1 }, { transaction }));
}

/**
 * Replaces the working copy when the stored version still equals `baseVersion` (optimistic lock).
 * @param id - design id.
 * @param design - new content.
 * @param baseVersion - expected current version.
 * @param transaction - the write transaction.
 * @returns true when saved, false when the version moved on.
 */
export async function updateDesignIfVersion(id: number, design: DesignInput, baseVersion: number, transaction: Transaction): Promise<boolean> {
  const [count] = await DesignModel.update(
    { content: JSON.stringify(design), name: design.name, version: baseVersion + 1 },
    { where: { id, version: baseVersion }, transaction },
  );
  return count === 1;
}
