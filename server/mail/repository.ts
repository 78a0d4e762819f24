// Captured-mail storage; returns plain objects.
import type { Transaction } from 'sequelize';
import { Op } from 'sequelize';
import { MailMessageModel } from './model';

/** A captured message. */
export interface MailRow {
  id: number;
  sender: string;
  recipients: string[];
  subject: string;
  text: string;
  createdAt: Date;
}

/**
 * Stores a received message.
 * @param row - the message.
 * @param transaction - the write transaction.
 */
export async function insertMail(row: Omit<MailRow, 'id' | 'createdAt'>, transaction: Transaction): Promise<void> {
  await MailMessageModel.create({ sender: row.sender, recipients: JSON.stringify(row.recipients), subject: row.subject.slice(0, 300), text: row.text }, { transaction });
}

/**
 * Lists messages, newest first.
 * @param q - optional recipient filter and limit.
 * @returns the rows.
 */
export async function findMail(q: { to?: string; limit: number }): Promise<MailRow[]> {
  const rows = await MailMessageModel.findAll({
    where: q.to ? { recipients: { [Op.like]: `%${q.to.replace(/[%_]/g, '')}%` } } : {},
    order: [['id', 'DESC']], limit: q.limit,
  });
  return rows.map((m) => ({ id: m.id, sender: m.sender, recipients: JSON.parse(m.recipients) as string[], subject: m.subject, text: m.text, createdAt: m.createdAt }));
}
