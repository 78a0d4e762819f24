// Sign-in: bcrypt password check and a signed JWT.
import bcrypt from 'bcryptjs';
import jwt from 'jsonwebtoken';
import type { LoginRequest } from '../../shared/api/auth';
import { unauthorized } from '../errors';
import { record } from '../audit/service';
import { JWT_ISSUER } from '../middleware/authenticate';
import type { AppContext } from '../middleware/context';
import { findUserByEmail, type UserRow } from '../users/repository';

/** Session lifetime (common practice, no source). */
export const SESSION_LIFETIME_S = 12 * 3600;

// Compared against when the e-mail is unknown, so both paths cost one bcrypt check.
const DUMMY_HASH = bcrypt.hashSync('not-a-password', 10);

/**
 * Checks credentials and issues a session token.
 * @param app - services.
 * @param input - e-mail and password.
 * @returns token and account.
 */
export async function login(app: AppContext, input: LoginRequest): Promise<{ token: string; user: UserRow }> {
  const user = await findUserByEmail(input.email);
  const ok = await bcrypt.compare(input.password, user?.passwordHash ?? DUMMY_HASH);
  if (!user || !ok || user.disabled) throw unauthorized('wrong e-mail or password, or the account is disabled');
  const token = jwt.sign({ role: user.role }, app.config.jwtSecret, { subject: String(user.id), issuer: JWT_ISSUER, expiresIn: SESSION_LIFETIME_S, algorithm: 'HS256' });
  await app.db.write((t) => record(t, { kind: 'user', id: user.id, email: user.email, name: user.name, role: user.role }, 'user.login', 'user', user.id, {}));
  return { token, user };
}
