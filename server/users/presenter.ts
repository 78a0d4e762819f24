// Serialises accounts.
import type { SessionUser } from '../../shared/api/auth';
import type { Person } from '../../shared/api/common';
import type { User } from '../../shared/api/users';
import type { UserRow } from './repository';

/**
 * Admin view of an account.
 * @param row - the account.
 * @returns the DTO.
 */
export function presentUser(row: UserRow): User {
  return { id: row.id, email: row.email, name: row.name, role: row.role, disabled: row.disabled, createdAt: row.createdAt.toISOString() };
}

/**
 * The signed-in account.
 * @param row - the account.
 * @returns the DTO.
 */
export function presentSessionUser(row: Pick<UserRow, 'id' | 'email' | 'name' | 'role'>): SessionUser {
  return { id: row.id, email: row.email, name: row.name, role: row.role };
}

/**
 * A person reference.
 * @param row - the account.
 * @returns the DTO.
 */
export function presentPerson(row: Pick<UserRow, 'id' | 'email' | 'name'> | null | undefined): Person {
  return row ? { id: row.id, name: row.name, email: row.email } : { id: 0, name: '(unknown)', email: '' };
}
