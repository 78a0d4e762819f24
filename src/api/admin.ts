// Administration (CONTRACT section 6: /api/admin/users, /api/admin/mail, /api/admin/audit).
import type { AuditEvent, ListAuditQuery, MailMessage } from '../../shared/api/admin';
import type { CreateUserRequest, UpdateUserRequest, User } from '../../shared/api/users';
import { apiRequest } from './client';

function unwrapUser(body: User | { user: User }): User {
  return 'user' in body ? body.user : body;
}

/**
 * Lists every account with its role and state.
 * @returns the accounts.
 */
export async function listAccounts(): Promise<User[]> {
  const body = await apiRequest<User[] | { users: User[] }>('GET', '/api/admin/users');
  return Array.isArray(body) ? body : body.users;
}

/**
 * Creates an account.
 * @param request - e-mail, name, role and first password.
 * @returns the account.
 */
export async function createAccount(request: CreateUserRequest): Promise<User> {
  return unwrapUser(await apiRequest<User | { user: User }>('POST', '/api/admin/users', request));
}

/**
 * Changes role, name or the disabled flag of an account.
 * @param id - account id.
 * @param change - the fields to change.
 * @returns the account after the change.
 */
export async function updateAccount(id: number, change: UpdateUserRequest): Promise<User> {
  return unwrapUser(await apiRequest<User | { user: User }>('PATCH', `/api/admin/users/${encodeURIComponent(String(id))}`, change));
}

/** Filters of the audit log as the page sends them (limit defaults on the server). */
export type AuditFilter = Partial<Omit<ListAuditQuery, 'limit'>> & { limit?: number };

/**
 * Reads the audit log, newest first, filtered.
 * @param filter - action, actor, target and time window.
 * @returns the entries.
 */
export async function listAudit(filter: AuditFilter = {}): Promise<AuditEvent[]> {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(filter)) {
    if (value !== undefined && value !== null && value !== '') search.set(key, String(value));
  }
  const suffix = search.toString() ? `?${search.toString()}` : '';
  const body = await apiRequest<AuditEvent[] | { events: AuditEvent[] } | { audit: AuditEvent[] }>('GET', `/api/admin/audit${suffix}`);
  if (Array.isArray(body)) return body;
  return 'events' in body ? body.events : body.audit;
}

/**
 * Reads the messages the local mail server received.
 * @param to - optional recipient filter.
 * @returns the messages, newest first.
 */
export async function listMail(to?: string): Promise<MailMessage[]> {
  const suffix = to ? `?${new URLSearchParams({ to }).toString()}` : '';
  const body = await apiRequest<MailMessage[] | { messages: MailMessage[] }>('GET', `/api/admin/mail${suffix}`);
  return Array.isArray(body) ? body : body.messages;
}
