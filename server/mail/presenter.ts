// Serialises captured mail.
import type { MailMessage } from '../../shared/api/admin';
import type { MailRow } from './repository';

/**
 * One message.
 * @param row - the message.
 * @returns the DTO.
 */
export function presentMail(row: MailRow): MailMessage {
  return { id: row.id, from: row.sender, to: row.recipients, subject: row.subject, text: row.text, receivedAt: row.createdAt.toISOString() };
}
