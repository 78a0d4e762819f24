// Serialises audit entries.
import type { AuditAction, AuditEvent } from '../../shared/api/admin';
import type { AuditRow } from './repository';

/**
 * One entry.
 * @param row - the entry.
 * @returns the DTO.
 */
export function presentAudit(row: AuditRow): AuditEvent {
  return {
    id: row.id, actor: { kind: row.actorKind, id: row.actorId, label: row.actorLabel }, action: row.action as AuditAction,
    targetType: row.targetType, targetId: row.targetId, details: row.details, createdAt: row.createdAt.toISOString(),
  };
}
