// Serialises audit entries.
import type { AuditAction, AuditEvent } from '../../shared/api/admin';
import type { AuditRow } from './repository';

/**
 * One entry.
 * @param row - the entry.
 * @param targetLabel - the target's readable name (null when it has none).
 * @returns the DTO.
 */
export function presentAudit(row: AuditRow, targetLabel: string | null = null): AuditEvent {
  return {
    id: row.id, actor: { kind: row.actorKind, id: row.actorId, label: row.actorLabel }, action: row.action as AuditAction,
    targetType: row.targetType, targetId: row.targetId, targetLabel, details: row.details, createdAt: row.createdAt.toISOString(),
  };
}
