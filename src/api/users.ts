// Accounts as seen by everyone (names for owners and authors). Admin changes live in the admin module.
import { apiRequest } from './client';
import type { User } from '../../shared/api/users';

/**
 * Lists accounts (admin only on the server; others get 403).
 * @returns the accounts.
 */
export async function listUsers(): Promise<User[]> {
  const body = await apiRequest<User[] | { users: User[] }>('GET', '/api/admin/users');
  return Array.isArray(body) ? body : body.users;
}
