// Account storage; returns plain objects.
import { QueryTypes, type Transaction } from 'sequelize';
import { lockFor } from '../db/connection';
import { rowsByIds } from '../db/filters';
import type { Role } from '../../shared/api/common';
import { UserModel } from './model';

/** An account row. */
export interface UserRow {
  id: number;
  email: string;
  name: string;
  role: Role;
  passwordHash: string;
  disabled: boolean;
  createdAt: Date;
}

const plain = (m: UserModel): UserRow => ({ id: m.id, email: m.email, name: m.name, role: m.role, passwordHash: m.passwordHash, disabled: Boolean(m.disabled), createdAt: m.createdAt });

/**
 * Finds an account by e-mail.
 * @param email - lower-case address.
 * @returns the row or null.
 */
export async function findUserByEmail(email: string): Promise<UserRow | null> {
  const m = await UserModel.findOne({ where: { email } });
  return m ? plain(m) : null;
}

/**
 * Finds an account by id.
 * @param id - user id.
 * @param transaction - optional transaction.
 * @returns the row or null.
 */
export async function findUser(id: number, transaction?: Transaction): Promise<UserRow | null> {
  const m = await UserModel.findByPk(id, { transaction });
  return m ? plain(m) : null;
}

/**
 * Reads an account and locks its row until the transaction ends (changes decided on what it read).
 * @param id - user id.
 * @param transaction - the write transaction.
 * @returns the row or null.
 */
export async function lockUser(id: number, transaction: Transaction): Promise<UserRow | null> {
  const m = await UserModel.findByPk(id, lockFor(transaction));
  return m ? plain(m) : null;
}

/** A person as lists show them: id, name, e-mail. */
export type PersonRow = Pick<UserRow, 'id' | 'name' | 'email'>;

/**
 * People by id, in one query (for the rows of a list page).
 * @param ids - user ids (repeats allowed; at most one page of rows' worth).
 * @returns the people found, by id.
 */
export async function peopleByIds(ids: readonly number[]): Promise<Map<number, PersonRow>> {
  const rows = await rowsByIds(UserModel, ids, ['id', 'name', 'email']);
  return new Map(rows.map((m) => [m.id, { id: m.id, name: m.name, email: m.email }]));
}

/**
 * Finds an enabled account by id (what a session needs of it).
 * @param id - user id.
 * @returns the row or null when absent or disabled.
 */
export async function findActiveUser(id: number): Promise<Pick<UserRow, 'id' | 'email' | 'name' | 'role'> | null> {
  // Every signed-in request asks this: one plain statement, no model instance.
  const [row] = await UserModel.sequelize!.query<Pick<UserRow, 'id' | 'email' | 'name' | 'role'>>(
    'SELECT id, email, name, role FROM users WHERE id = :id AND disabled = :enabled', { replacements: { id, enabled: false }, type: QueryTypes.SELECT },
  );
  return row ?? null;
}

/**
 * Lists accounts by id.
 * @returns the rows.
 */
export async function listUsers(): Promise<UserRow[]> {
  return (await UserModel.findAll({ order: [['id', 'ASC']] })).map(plain);
}

/**
 * Lists enabled accounts with one role.
 * @param role - the role.
 * @returns the rows.
 */
export async function listActiveUsersWithRole(role: Role): Promise<UserRow[]> {
  return (await UserModel.findAll({ where: { role, disabled: false }, order: [['id', 'ASC']] })).map(plain);
}

/**
 * Counts accounts.
 * @returns how many.
 */
export async function countUsers(): Promise<number> {
  return UserModel.count();
}

/**
 * Inserts an account.
 * @param data - fields.
 * @param transaction - the write transaction.
 * @returns the row.
 */
export async function insertUser(data: { email: string; name: string; role: Role; passwordHash: string }, transaction: Transaction): Promise<UserRow> {
  return plain(await UserModel.create(data, { transaction }));
}

/**
 * Updates an account.
 * @param id - user id.
 * @param changes - fields to change.
 * @param transaction - the write transaction.
 */
export async function updateUser(id: number, changes: Partial<Pick<UserRow, 'role' | 'disabled' | 'name'>>, transaction: Transaction): Promise<void> {
  await UserModel.update(changes, { where: { id }, transaction });
}
