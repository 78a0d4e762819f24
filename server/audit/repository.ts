// Audit storage; returns plain objects.
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import type { ListAuditQuery } from '../../shared/api/admin';
import { AuditEventModel } from './model';

/** An audit row with its details parsed. */
export interface AuditRow {
  id: number;
  actorKind: 'user' | 'token' | 'system';
  actorId: number | null;
  actorLabel: string;
  action: string;
  targetType: string;
  targetId: number | null;
  details: Record<string, unknown>;
  createdAt: Date;
}

/**
 * Appends an entry.
 * @param row - the entry without id and time.
 * @param transaction - the write transaction.
 */
export async function insertAudit(row: Omit<AuditRow, 'id' | 'createdAt'>, transaction: Transaction): Promise<void> {
  await AuditEventModel.create({ ...row, details: JSON.stringify(row.details) }, { transaction });
}

/**
 * One page of entries, newest first, and how many match.
 * @param q - filters and page.
 * @returns the rows of the page and the total.
 */
export async function findAudit(q: ListAuditQuery): Promise<{ rows: AuditRow[]; total: number }> {
  const where: WhereOptions = {};
  const w = where as Record<string | symbol, unknown>;
  if (q.action) w.action = q.action;
  if (q.actorId) w.actorId = q.actorId;
  if (q.targetType) w.targetType = q.targetType;
  if (q.targetId) w.targetId = q.targetId;
  if (q.since || q.until) w.createdAt = { ...(q.since ? { [Op.gte]: new Date(q.since) } : {}), ...(q.until ? { [Op.lte]: new Date(q.until) } : {}) };
  const [total, rows] = await Promise.all([
    AuditEventModel.count({ where }),
    AuditEventModel.findAll({ where, order: [['id', 'DESC']], limit: q.limit, offset: q.offset }),
  ]);
  return { total, rows: rows.map((m) => ({
    id: m.id, actorKind: m.actorKind, actorId: m.actorId, actorLabel: m.actorLabel, action: m.action,
    targetType: m.targetType, targetId: m.targetId, details: JSON.parse(m.details) as Record<string, unknown>, createdAt: m.createdAt,
  })) };
}
