// Accounts as seen by everyone (names for owners and authors). Admin changes live in the admin module.
import { apiRequest } from './client';
import type { SessionUser } from './types';

/**
 * Lists accounts (admin only on the server; others get 403).
 * @returns the accounts.
 */
export async function listUsers(): Promise<SessionUser[]> {
  const body = await apiRequest<SessionUser[] | { users: SessionUser[] }>('GET', '/api/admin/users');
  return Array.isArray(body) ? body : body.users;
}
