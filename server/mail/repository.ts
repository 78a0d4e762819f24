// Captured-mail storage; returns plain objects.
import type { Transaction } from 'sequelize';
import type { ListMailQuery } from '../../shared/api/admin';
import { textContains } from '../db/filters';
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
 * One page of messages, newest first, and how many match.
 * @param q - optional recipient filter (case-insensitive part of an address) and page.
 * @returns the rows of the page and the total.
 */
export async function findMail(q: ListMailQuery): Promise<{ rows: MailRow[]; total: number }> {
  const where = q.to ? textContains('MailMessage.recipients', q.to) : {};
  const [total, rows] = await Promise.all([
    MailMessageModel.count({ where }),
    MailMessageModel.findAll({ where, order: [['id', 'DESC']], limit: q.limit, offset: q.offset }),
  ]);
  return { total, rows: rows.map((m) => ({ id: m.id, sender: m.sender, recipients: JSON.parse(m.recipients) as string[], subject: m.subject, text: m.text, createdAt: m.createdAt })) };
}
