// The audit log: every state change, release, download, token use and role change.
import type { Transaction } from 'sequelize';
import type { AuditAction, ListAuditQuery } from '../../shared/api/admin';
import { actorLabel, type Actor } from '../middleware/context';
import { findAudit, insertAudit, type AuditRow } from './repository';

/**
 * Records one entry inside the caller's transaction (so it commits or rolls back with the change).
 * @param transaction - the write transaction.
 * @param actor - who (null: the system).
 * @param action - what.
 * @param targetType - kind of target.
 * @param targetId - target id.
 * @param details - anything worth keeping.
 */
export async function record(transaction: Transaction, actor: Actor | null, action: AuditAction, targetType: string, targetId: number | null, details: Record<string, unknown>): Promise<void> {
  await insertAudit({
    actorKind: actor === null ? 'system' : actor.kind,
    actorId: actor === null ? null : actor.kind === 'user' ? actor.id : actor.tokenId,
    actorLabel: actorLabel(actor), action, targetType, targetId, details,
  }, transaction);
}

/**
 * Reads the log.
 * @param q - filters and page.
 * @returns one page of entries, newest first, and how many match.
 */
export function searchAudit(q: ListAuditQuery): Promise<{ rows: AuditRow[]; total: number }> {
  return findAudit(q);
}
