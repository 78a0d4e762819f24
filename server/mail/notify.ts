// Notifications of the team flow: submitted → reviewers; decision → author; released → testers.
import type { Role } from '../../shared/api/common';
import type { AppContext } from '../middleware/context';
import { findUser, listActiveUsersWithRole } from '../users/repository';

/**
 * Mails every enabled account with a role.
 * @param app - services.
 * @param role - recipients' role.
 * @param subject - subject line.
 * @param text - body.
 */
export async function notifyRole(app: AppContext, role: Role, subject: string, text: string): Promise<void> {
  const users = await listActiveUsersWithRole(role);
  await app.mailer.send(users.map((u) => u.email), subject, text);
}

/**
 * Mails one account.
 * @param app - services.
 * @param userId - recipient.
 * @param subject - subject line.
 * @param text - body.
 */
export async function notifyUser(app: AppContext, userId: number, subject: string, text: string): Promise<void> {
  const user = await findUser(userId);
  if (user && !user.disabled) await app.mailer.send([user.email], subject, text);
}
