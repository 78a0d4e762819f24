// Admin payloads: captured mail and the audit log (CONTRACT section 6: /api/admin).
import { z } from 'zod';
import { listFilterText, pageQueryShape } from './paging';

/** One message the local mail server received. */
export const mailMessageSchema = z.object({
  id: z.number().int(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  receivedAt: z.string(),
});
/** A captured message. */
export type MailMessage = z.infer<typeof mailMessageSchema>;

/** Query of `GET /api/admin/mail`: optional recipient filter, one page (newest first). */
export const listMailQuerySchema = z.object({
  to: listFilterText(254).optional(),
  ...pageQueryShape('mail'),
});
/** A mail-outbox query. */
export type ListMailQuery = z.infer<typeof listMailQuerySchema>;

/** Audit actions. */
export const auditActionSchema = z.enum([
  'user.login', 'user.create', 'user.role-change', 'user.disable', 'user.enable', 'user.rename',
  'design.create', 'design.save', 'revision.submit', 'revision.supersede', 'review.approve', 'review.changes',
  'release.create', 'release.withdraw', 'release.download', 'token.create', 'token.revoke', 'token.use', 'draft.export',
]);
/** An audit action. */
export type AuditAction = z.infer<typeof auditActionSchema>;

/** One audit entry. */
export const auditEventSchema = z.object({
  id: z.number().int(),
  actor: z.object({ kind: z.enum(['user', 'token', 'system']), id: z.number().int().nullable(), label: z.string() }),
  action: auditActionSchema,
  targetType: z.string(),
  targetId: z.number().int().nullable(),
  /** The target's readable name (design name, `design r3`, `design 1.2.0`, an e-mail); null when unknown. */
  targetLabel: z.string().nullable(),
  details: z.record(z.string(), z.unknown()),
  createdAt: z.string(),
});
/** An audit entry. */
export type AuditEvent = z.infer<typeof auditEventSchema>;

/** Query of `GET /api/admin/audit`: filters by action, actor user, target and time window; one page (newest first). */
export const listAuditQuerySchema = z.object({
  action: auditActionSchema.optional(),
  actorId: z.coerce.number().int().positive().optional(),
  targetType: listFilterText(40).optional(),
  targetId: z.coerce.number().int().positive().optional(),
  since: z.iso.datetime({ message: 'must be an ISO 8601 time' }).optional(),
  until: z.iso.datetime({ message: 'must be an ISO 8601 time' }).optional(),
  ...pageQueryShape('audit'),
});
/** An audit filter. */
export type ListAuditQuery = z.infer<typeof listAuditQuerySchema>;
