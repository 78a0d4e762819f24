// Administration (CONTRACT section 6: /api/admin/users, /api/admin/mail, /api/admin/audit).
import type { AuditEvent, ListAuditQuery, MailMessage } from '../../shared/api/admin';
import { PAGE_SIZES, type Page, type PageRequest } from '../../shared/api/paging';
import type { CreateUserRequest, UpdateUserRequest, User } from '../../shared/api/users';
import { apiPage, apiRequest } from './client';

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

/** Filters of the audit log as the page sends them. */
export type AuditFilter = Partial<Omit<ListAuditQuery, 'limit' | 'offset'>>;

/**
 * Reads one page of the audit log, newest first, filtered.
 * @param filter - action, actor, target and time window.
 * @param page - limit and offset (default: the newest page).
 * @returns the page with the number of matching entries.
 */
export function listAudit(filter: AuditFilter = {}, page: PageRequest = { limit: PAGE_SIZES.audit.default, offset: 0 }): Promise<Page<AuditEvent>> {
  return apiPage<AuditEvent>('/api/admin/audit', filter, page);
}

/**
 * Reads one page of the messages the local mail server received, newest first.
 * @param to - optional recipient filter.
 * @param page - limit and offset (default: the newest page).
 * @returns the page with the number of matching messages.
 */
export function listMail(to?: string, page: PageRequest = { limit: PAGE_SIZES.mail.default, offset: 0 }): Promise<Page<MailMessage>> {
  return apiPage<MailMessage>('/api/admin/mail', { to }, page);
}
