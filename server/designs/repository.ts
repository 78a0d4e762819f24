// Design storage; returns plain objects with the working copy parsed.
import { Op, type Transaction } from 'sequelize';
import type { DesignInput } from '../../shared/control';
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

const plain = (m: DesignModel): DesignRow => ({ id: m.id, name: m.name, ownerId: m.ownerId, design: JSON.parse(m.content) as DesignInput, version: m.version, createdAt: m.createdAt, updatedAt: m.updatedAt });

/**
 * Lists designs by name, optionally filtered.
 * @param q - case-insensitive substring of the name.
 * @returns the rows.
 */
export async function listDesignRows(q?: string): Promise<DesignRow[]> {
  const where = q ? { name: { [Op.like]: `%${q.replace(/[%_]/g, '')}%` } } : {};
  return (await DesignModel.findAll({ where, order: [['name', 'ASC']] })).map(plain);
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
