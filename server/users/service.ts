// Account administration.
import bcrypt from 'bcryptjs';
import type { CreateUserRequest, UpdateUserRequest } from '../../shared/api/users';
import { AppError, notFound } from '../errors';
import { record } from '../audit/service';
import type { AppContext, UserActor } from '../middleware/context';
import { findUser, findUserByEmail, insertUser, listUsers, lockUser, updateUser, type UserRow } from './repository';

/** bcrypt cost factor (OWASP Password Storage Cheat Sheet, 2023: at least 10). */
export const BCRYPT_ROUNDS = 10;

/**
 * Hashes a password with bcrypt.
 * @param password - the plain password.
 * @returns the hash.
 */
export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_ROUNDS);
}

/**
 * Lists accounts.
 * @returns the rows.
 */
export function allUsers(): Promise<UserRow[]> {
  return listUsers();
}

/**
 * Creates an account.
 * @param app - services.
 * @param actor - the admin.
 * @param input - the new account.
 * @returns the row.
 */
export async function createUser(app: AppContext, actor: UserActor, input: CreateUserRequest): Promise<UserRow> {
  if (await findUserByEmail(input.email)) throw new AppError('email-taken', `an account for ${input.email} already exists`, 409, { fields: [{ path: 'email', message: 'is already taken' }] });
  const passwordHash = await hashPassword(input.password);
  return app.db.write(async (t) => {
    const row = await insertUser({ email: input.email, name: input.name, role: input.role, passwordHash }, t);
    await record(t, actor, 'user.create', 'user', row.id, { email: row.email, role: row.role });
    return row;
  });
}

/**
 * Changes role, name or the disabled flag. An admin cannot demote or disable themself (someone must remain admin).
 * @param app - services.
 * @param actor - the admin.
 * @param id - account id.
 * @param input - the changes.
 * @returns the updated row.
 */
export async function changeUser(app: AppContext, actor: UserActor, id: number, input: UpdateUserRequest): Promise<UserRow> {
  return app.db.write(async (t) => {
    const before = await lockUser(id, t);
    if (!before) throw notFound(`user ${id}`);
    if (id === actor.id && ((input.role !== undefined && input.role !== 'admin') || input.disabled === true)) {
      throw new AppError('self-lockout', 'admins cannot remove their own admin role or disable themselves', 409);
    }
    await updateUser(id, input, t);
    if (input.role !== undefined && input.role !== before.role) await record(t, actor, 'user.role-change', 'user', id, { from: before.role, to: input.role });
    if (input.disabled !== undefined && input.disabled !== before.disabled) await record(t, actor, input.disabled ? 'user.disable' : 'user.enable', 'user', id, {});
    if (input.name !== undefined && input.name !== before.name) await record(t, actor, 'user.rename', 'user', id, { from: before.name, to: input.name });
    return (await findUser(id, t)) as UserRow;
  });
}
