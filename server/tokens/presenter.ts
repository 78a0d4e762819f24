// Serialises tokens.
import type { AccessToken } from '../../shared/api/releases';
import { findUser, type UserRow } from '../users/repository';
import { presentPerson } from '../users/presenter';
import type { TokenRow } from './repository';

/**
 * One token (never the secret).
 * @param row - the token.
 * @param owner - its owner.
 * @returns the DTO.
 */
export function presentToken(row: TokenRow, owner: UserRow | null): AccessToken {
  return {
    id: row.id, name: row.name, owner: presentPerson(owner), prefix: row.prefix, createdAt: row.createdAt.toISOString(),
    lastUsedAt: row.lastUsedAt ? row.lastUsedAt.toISOString() : null, revokedAt: row.revokedAt ? row.revokedAt.toISOString() : null,
  };
}

/**
 * One token with its owner looked up.
 * @param row - the token.
 * @returns the DTO.
 */
export async function tokenView(row: TokenRow): Promise<AccessToken> {
  return presentToken(row, await findUser(row.ownerId));
}
